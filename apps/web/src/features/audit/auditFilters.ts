import { AUDIT_ENTITY_TYPES, type AuditEntityType } from '@hitchbook/shared/schemas/audit';

export interface AuditFilters {
  entityType: AuditEntityType | undefined;
  actorUserId: string | undefined;
  /** Days from and to, inclusive (YYYY-MM-DD). */
  from: string | undefined;
  to: string | undefined;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const DAY = /^\d{4}-\d{2}-\d{2}$/;

/** The log's filters from the address; a value the server would refuse is dropped so the page still opens. */
export function readAuditFilters(search: URLSearchParams): AuditFilters {
  const entityType = search.get('entityType') ?? '';
  const actorUserId = search.get('actorUserId') ?? '';
  const from = search.get('from') ?? '';
  const to = search.get('to') ?? '';
  const filters: AuditFilters = {
    entityType: (AUDIT_ENTITY_TYPES as readonly string[]).includes(entityType) ? (entityType as AuditEntityType) : undefined,
    actorUserId: UUID.test(actorUserId) ? actorUserId : undefined,
    from: DAY.test(from) ? from : undefined,
    to: DAY.test(to) ? to : undefined,
  };
  if (filters.from && filters.to && filters.from > filters.to) filters.to = undefined;
  return filters;
}

export function hasAuditFilters(filters: AuditFilters): boolean {
  return Object.values(filters).some((v) => v !== undefined);
}

export const ENTITY_LABELS: Record<AuditEntityType, string> = {
  'work-entry': 'Work entry',
  'rate-sheet': 'Rate sheet',
  invoice: 'Invoice',
  machine: 'Machine',
  'cost-entry': 'Machine cost',
  'square-up': 'Square-up',
  'square-up-transfer': 'Square-up transfer',
  membership: 'Member and role',
  user: 'Sign-in',
  party: 'Household or customer',
  field: 'Field',
  'work-type': 'Work type',
  upload: 'File',
};

/** "work-entry.approved" reads "Work entry approved"; an action the screen does not know still reads sensibly. */
export function describeAction(action: string): string {
  const [entity = '', verb = ''] = action.split('.', 2);
  const what = (ENTITY_LABELS as Record<string, string>)[entity] ?? entity.replace(/-/g, ' ');
  const done = verb.replace(/-/g, ' ');
  const text = done ? `${what} ${done.toLowerCase()}` : what;
  return text.charAt(0).toUpperCase() + text.slice(1);
}
