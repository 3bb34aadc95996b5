import { describe, expect, it } from 'vitest';
import { hasFilters, readInvoiceFilters } from './invoiceFilters';

const PARTY = '24114622-54d5-46d1-b821-14fc8fa0c948';

describe('invoice list filters', () => {
  it('reads the party, state and issue dates from the address', () => {
    const filters = readInvoiceFilters(new URLSearchParams(`partyId=${PARTY}&state=overdue&from=2026-01-01&to=2026-06-30`));
    expect(filters).toEqual({ partyId: PARTY, state: 'overdue', from: '2026-01-01', to: '2026-06-30' });
    expect(hasFilters(filters)).toBe(true);
  });

  it('drops values the server would refuse instead of failing the list', () => {
    const filters = readInvoiceFilters(new URLSearchParams('partyId=42&state=lost&from=June&to=2026-13'));
    expect(filters).toEqual({ partyId: undefined, state: undefined, from: undefined, to: undefined });
    expect(hasFilters(filters)).toBe(false);
  });

  it('keeps the start date and drops an end date that comes before it', () => {
    expect(readInvoiceFilters(new URLSearchParams('from=2026-06-01&to=2026-05-01'))).toMatchObject({ from: '2026-06-01', to: undefined });
  });
});
