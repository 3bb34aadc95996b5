import { WORK_ENTRY_SORTS, WORK_ENTRY_STATES, type WorkEntryState } from '@hitchbook/shared/schemas/work-entries';
import type { WorkEntryFilters } from './api/listWorkEntries';

const DAY = /^\d{4}-\d{2}-\d{2}$/;
const ID = /^[0-9a-f-]{36}$/i;

const SORTS = new Set<string>(WORK_ENTRY_SORTS.flatMap((s) => [s, `-${s}`]));

const day = (raw: string | null) => (raw && DAY.test(raw) ? raw : undefined);
const id = (raw: string | null) => (raw && ID.test(raw) ? raw : undefined);

/** The table's filters read back from the URL; anything malformed is dropped rather than sent. */
export function readEntryFilters(search: URLSearchParams): WorkEntryFilters {
  const states = (search.get('state') ?? '')
    .split(',')
    .filter((s): s is WorkEntryState => (WORK_ENTRY_STATES as readonly string[]).includes(s));
  const sort = search.get('sort');
  return {
    dateFrom: day(search.get('dateFrom')),
    dateTo: day(search.get('dateTo')),
    machineId: id(search.get('machineId')),
    fieldId: id(search.get('fieldId')),
    operatorUserId: id(search.get('operatorUserId')),
    billToPartyId: id(search.get('billToPartyId')),
    workTypeId: id(search.get('workTypeId')),
    states: [...new Set(states)],
    sort: sort && SORTS.has(sort) ? sort : '-date',
  };
}

export function hasFilters(filters: WorkEntryFilters): boolean {
  const { sort: _sort, states, ...rest } = filters;
  return states.length > 0 || Object.values(rest).some(Boolean);
}

/** The patch that empties every filter but keeps the sort. */
export const CLEARED_FILTERS = {
  dateFrom: undefined,
  dateTo: undefined,
  machineId: undefined,
  fieldId: undefined,
  operatorUserId: undefined,
  billToPartyId: undefined,
  workTypeId: undefined,
  state: undefined,
} as const;
