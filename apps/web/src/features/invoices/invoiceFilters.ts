import { INVOICE_STATES, type InvoiceState } from '@hitchbook/shared/schemas/invoices';

export interface InvoiceFilters {
  partyId: string | undefined;
  state: InvoiceState | undefined;
  /** Issue dates from and to, inclusive (YYYY-MM-DD). */
  from: string | undefined;
  to: string | undefined;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const DAY = /^\d{4}-\d{2}-\d{2}$/;

/**
 * The list's filters from the address. A bookmark from an older version or a hand-typed value
 * that the server would refuse is dropped, so the list still opens.
 */
export function readInvoiceFilters(search: URLSearchParams): InvoiceFilters {
  const partyId = search.get('partyId') ?? '';
  const state = search.get('state') ?? '';
  const from = search.get('from') ?? '';
  const to = search.get('to') ?? '';
  const filters: InvoiceFilters = {
    partyId: UUID.test(partyId) ? partyId : undefined,
    state: (INVOICE_STATES as readonly string[]).includes(state) ? (state as InvoiceState) : undefined,
    from: DAY.test(from) ? from : undefined,
    to: DAY.test(to) ? to : undefined,
  };
  // Dates the wrong way round would only earn a 400; keep the start and let the person fix the end.
  if (filters.from && filters.to && filters.from > filters.to) filters.to = undefined;
  return filters;
}

export function hasFilters(filters: InvoiceFilters): boolean {
  return Object.values(filters).some((v) => v !== undefined);
}
