import type { PartyKind, Relationship } from './api/listParties';

export const KIND_LABELS: Record<PartyKind, string> = { household: 'Household', customer: 'Customer' };

export const RELATIONSHIP_LABELS: Record<Relationship, string> = {
  family: 'Family',
  neighbour: 'Neighbour',
  agency: 'Public agency',
};
