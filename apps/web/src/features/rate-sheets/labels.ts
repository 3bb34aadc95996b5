import dayjs from 'dayjs';
import type { ChargeTypeName, RateRelationship } from '@hitchbook/shared/schemas/rate-sheets';
import type { WorkUnit } from '@hitchbook/shared/work-types';

export const RELATIONSHIP_LABELS: Record<RateRelationship, string> = {
  family: 'Family',
  neighbour: 'Neighbour',
  agency: 'Public agency',
};

export const RELATIONSHIP_COLORS: Record<RateRelationship, string> = {
  family: 'harbor',
  neighbour: 'clay',
  agency: 'slate',
};

/** Whom a relationship's own sheet prices, when no sheet was made for one party alone. */
export const RELATIONSHIP_PARTIES: Record<RateRelationship, string> = {
  family: 'All family households',
  neighbour: 'All neighbours',
  agency: 'All public agencies',
};

export const CHARGE_TYPE_LABELS: Record<ChargeTypeName, string> = { custom: 'Custom', rental: 'Rental' };

/** The one line every rate form and table repeats, so nobody has to guess what a rental includes. */
export const CHARGE_TYPE_NOTE = 'Custom = machine, tractor, fuel and operator; rental = the machine only.';

export const UNIT_LABELS: Record<WorkUnit, string> = { acre: 'acre', hour: 'hour', mile: 'mile', load: 'load', each: 'each' };

export const MINIMUM_PER_LABELS: Record<'entry' | 'visit', string> = { entry: 'per entry', visit: 'per visit' };

export const SHEET_CHANGE_NOTE =
  'Changing a sheet never changes an issued invoice: an invoice keeps the rates it was issued with.';

/** "Mar 1, 2026", from a calendar day (YYYY-MM-DD) or an instant. */
export function formatDay(iso: string): string {
  return dayjs(iso).format('MMM D, YYYY');
}
