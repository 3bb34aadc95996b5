import { describe, expect, it } from 'vitest';
import { sheetInForce as chooseFrom, type SheetCandidate } from './sheet-choice.js';

const sheetInForce = <T extends SheetCandidate>(sheets: T[], p: { id: string; relationship: SheetCandidate['relationship'] }, date: string) => chooseFrom(sheets, p, date, (s) => s);
const party = { id: 'brandvold', relationship: 'neighbour' as const };
const sheet = (name: string, effectiveFrom: string, extra: Partial<SheetCandidate> = {}) => ({ name, effectiveFrom, partyId: null, relationship: 'neighbour' as const, ...extra });

describe('choosing the rate sheet for a work date', () => {
  const sheets = [
    sheet('neighbour 2024', '2024-01-01'),
    sheet('neighbour 2025', '2025-01-01'),
    sheet('family 2025', '2025-01-01', { relationship: 'family' }),
    sheet('brandvold special', '2025-06-01', { partyId: 'brandvold' }),
    sheet('another party', '2025-02-01', { partyId: 'someone-else' }),
  ];

  it('takes the relationship sheet started most recently on or before the date', () => {
    expect(sheetInForce(sheets, party, '2024-12-31')).toEqual({ sheet: sheets[0], source: 'relationship' });
    expect(sheetInForce(sheets, party, '2025-01-01')).toEqual({ sheet: sheets[1], source: 'relationship' });
  });

  it("prefers the party's own override sheet once it is in force", () => {
    expect(sheetInForce(sheets, party, '2025-05-31')?.sheet.name).toBe('neighbour 2025');
    expect(sheetInForce(sheets, party, '2025-06-01')).toEqual({ sheet: sheets[3], source: 'party-override' });
  });

  it("never uses another relationship's or another party's sheet", () => {
    expect(sheetInForce(sheets, { id: 'okonkwo', relationship: 'neighbour' }, '2025-03-01')?.sheet.name).toBe('neighbour 2025');
    expect(sheetInForce(sheets, { id: 'township', relationship: 'agency' }, '2025-03-01')).toBeNull();
  });

  it('finds nothing before the first sheet starts', () => {
    expect(sheetInForce(sheets, party, '2023-12-31')).toBeNull();
  });
});
