import { describe, expect, it } from 'vitest';
import { Dec } from '@hitchbook/shared/decimal';
import type { LoadedSheet } from '../rate-sheets/rate-sheets.repository.js';
import { priceDraft, type EntryToBill } from './draft-pricing.js';

const party = { id: 'party-brandvold', relationship: 'neighbour' as const };

function sheet(id: string, extra: Partial<LoadedSheet['sheet']> = {}, lines: Array<Partial<LoadedSheet['lines'][number]>> = []): LoadedSheet {
  const now = new Date('2025-01-01T00:00:00Z');
  return {
    sheet: {
      id,
      operationId: 'op',
      name: `Sheet ${id}`,
      relationship: 'neighbour',
      partyId: null,
      effectiveFrom: '2025-01-01',
      minimumCharge: '0.00',
      minimumPer: 'entry',
      travelFlat: '0.00',
      travelPerMile: '0.0000',
      fuelBasePrice: null,
      fuelStep: null,
      fuelAdjustPctPerStep: null,
      operatorWage: '0.00',
      laborFactor: '1.100',
      termsDays: 30,
      notes: null,
      archivedAt: null,
      createdAt: now,
      updatedAt: now,
      ...extra,
    },
    partyName: null,
    lines: lines.map((l, i) => ({
      id: `${id}-line-${i}`,
      operationId: 'op',
      rateSheetId: id,
      workTypeId: 'mow',
      workTypeName: 'Mowing (rotary)',
      unit: 'acre',
      chargeType: 'custom',
      rate: '0',
      minimumCharge: null,
      ...l,
    })),
    machineRates: [],
  };
}

function entry(id: string, extra: Partial<EntryToBill>): EntryToBill {
  return {
    id,
    version: 3,
    workDate: '2025-06-03',
    workTypeId: 'mow',
    workTypeName: 'Mowing (rotary)',
    defaultUnit: 'acre',
    fieldName: 'Creek Bottom',
    hours: '2.50',
    acres: null,
    miles: null,
    loads: null,
    eachCount: null,
    ...extra,
  };
}

// Invented sheet and entries; every amount below is worked by hand.
const neighbour = sheet(
  'n2025',
  {
    minimumCharge: '75.00',
    travelFlat: '25.00',
    fuelBasePrice: '3.5000',
    fuelStep: '0.2500',
    fuelAdjustPctPerStep: '2.0000',
    operatorWage: '22.00',
    termsDays: 21,
  },
  [
    { workTypeId: 'mow', unit: 'acre', rate: '18.5000' },
    { workTypeId: 'cart', workTypeName: 'Grain cart', unit: 'hour', chargeType: 'rental', rate: '65.0000', minimumCharge: '100.00' },
  ],
);

describe('pricing a draft invoice line by line', () => {
  it('prices work, fuel adjustment, minimum, operator and travel per visit, to the cent', () => {
    const priced = priceDraft(
      party,
      [
        entry('e1', { acres: '38.500' }),
        entry('e2', { acres: '3.200', fieldName: 'Schoolhouse lot' }),
        entry('e3', { workDate: '2025-06-10', workTypeId: 'cart', workTypeName: 'Grain cart', defaultUnit: 'hour', hours: '4.50', fieldName: 'Schoolhouse 80' }),
      ],
      [neighbour],
      { dieselPricePerGallon: new Dec('4.05') },
    );
    expect(priced.ok).toBe(true);
    if (!priced.ok) return;
    // Diesel 4.05 is 0.55 over the 3.50 base: two whole 0.25 steps, +4 %, so 18.50 becomes 19.24 per acre.
    expect(priced.lines.map((l) => [l.kind, l.workEntryId, l.quantity, l.rate, l.amount])).toEqual([
      ['work', 'e1', '38.5', '18.5', '712.25'], // 38.5 × 18.50
      ['fuel-adjustment', 'e1', '1', '28.49', '28.49'], // 38.5 × 19.24 = 740.74, less 712.25
      ['work', 'e2', '3.2', '18.5', '59.20'], // 3.2 × 18.50
      ['fuel-adjustment', 'e2', '1', '2.37', '2.37'], // 3.2 × 19.24 = 61.568 → 61.57, less 59.20
      ['minimum', 'e2', '1', '13.43', '13.43'], // 75.00 − 61.57
      ['travel', null, '1', '25', '25.00'],
      ['work', 'e3', '4.5', '65', '292.50'], // rental: no fuel adjustment, above its own 100.00 minimum
      ['labour', 'e3', '4.95', '22', '108.90'], // 4.5 h × 1.1 = 4.95 labour hours × 22.00
      ['travel', null, '1', '25', '25.00'],
    ]);
    // 712.25 + 28.49 + 59.20 + 2.37 + 13.43 + 25 + 292.50 + 108.90 + 25 = 1,267.14
    expect(priced.subtotal).toBe('1267.14');
    expect(priced.termsDays).toBe(21);
    expect(priced.lines[0]).toMatchObject({ fieldName: 'Creek Bottom', workTypeName: 'Mowing (rotary)', workDate: '2025-06-03', details: { rateSheetId: 'n2025', entryVersion: 3, chargeType: 'custom' } });
  });

  it("uses the party's override sheet from its start date and the relationship's sheet before it", () => {
    const special = sheet('special', { partyId: party.id, effectiveFrom: '2025-06-05' }, [{ workTypeId: 'mow', unit: 'acre', rate: '15.0000' }]);
    const plain = sheet('plain', {}, [{ workTypeId: 'mow', unit: 'acre', rate: '20.0000' }]);
    const priced = priceDraft(party, [entry('before', { workDate: '2025-06-04', acres: '10' }), entry('after', { workDate: '2025-06-05', acres: '10' })], [plain, special], {});
    expect(priced.ok && priced.lines.map((l) => [l.workEntryId, l.amount, l.details.rateSheetId])).toEqual([
      ['before', '200.00', 'plain'],
      ['after', '150.00', 'special'],
    ]);
  });

  it('charges a per-visit minimum once for all entries of a work type on the same day', () => {
    const perVisit = sheet('visit', { minimumCharge: '100.00', minimumPer: 'visit' }, [{ workTypeId: 'mow', unit: 'acre', rate: '10.0000' }]);
    const priced = priceDraft(party, [entry('a', { acres: '3' }), entry('b', { acres: '4', fieldName: 'Second' }), entry('c', { workDate: '2025-06-04', acres: '12' })], [perVisit], {});
    // Day one earns 30 + 40 = 70, topped up by 30 to the 100 minimum; day two earns 120, no top-up.
    expect(priced.ok && priced.lines.map((l) => [l.kind, l.workDate, l.amount])).toEqual([
      ['work', '2025-06-03', '30.00'],
      ['work', '2025-06-03', '40.00'],
      ['minimum', '2025-06-03', '30.00'],
      ['work', '2025-06-04', '120.00'],
    ]);
  });

  it('bills the mileage of each visit at the sheet rate per mile when the miles are given', () => {
    const mileage = sheet('miles', { travelPerMile: '1.2500' }, [{ workTypeId: 'mow', unit: 'acre', rate: '10.0000' }]);
    const priced = priceDraft(party, [entry('a', { acres: '5' })], [mileage], { travelMilesPerVisit: new Dec('14.5') });
    // 14.5 × 1.25 = 18.125 → 18.13
    expect(priced.ok && priced.lines.at(-1)).toMatchObject({ kind: 'travel', quantity: '14.5', unit: 'mile', rate: '1.25', amount: '18.13' });
  });

  it('reports every entry it cannot price instead of leaving it out', () => {
    const narrow = sheet('narrow', { effectiveFrom: '2025-06-01' }, [{ workTypeId: 'mow', unit: 'acre', rate: '10.0000' }]);
    const priced = priceDraft(
      party,
      [
        entry('too-early', { workDate: '2025-05-01', acres: '5' }),
        entry('no-rate', { workTypeId: 'haul', workTypeName: 'Hauling', defaultUnit: 'load', loads: '3' }),
        entry('no-acres', { acres: null }),
      ],
      [narrow],
      {},
    );
    expect(priced.ok).toBe(false);
    expect(!priced.ok && priced.issues.map((i) => i.path).sort()).toEqual(['entries.no-acres', 'entries.no-rate', 'entries.too-early']);
  });

  it('asks for the diesel price when the sheet adjusts custom work for fuel', () => {
    const priced = priceDraft(party, [entry('e1', { acres: '10' })], [neighbour], {});
    expect(priced).toEqual({ ok: false, issues: [expect.objectContaining({ path: 'dieselPricePerGallon' })] });
  });

  it('prefers the work type’s usual unit, then custom work over rental', () => {
    const both = sheet('both', {}, [
      { workTypeId: 'mow', unit: 'hour', rate: '90.0000' },
      { workTypeId: 'mow', unit: 'acre', chargeType: 'rental', rate: '8.0000' },
      { workTypeId: 'mow', unit: 'acre', rate: '12.0000' },
    ]);
    const priced = priceDraft(party, [entry('e1', { acres: '10' })], [both], {});
    expect(priced.ok && priced.lines.map((l) => [l.unit, l.amount, l.details.chargeType])).toEqual([['acre', '120.00', 'custom']]);
  });
});
