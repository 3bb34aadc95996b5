import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { Decimal } from 'decimal.js';
import { fuelAdjustmentSteps, priceVisitOrThrow, resolveRateOrThrow, type PricedVisit, type Rate, type RateSheet, type Visit } from './pricing.js';

// Invented sheet; prices echo published survey averages where noted only to
// keep the example realistic. Every expected amount below is worked by hand.
function neighbourSheet(overrides: Partial<RateSheet> = {}): RateSheet {
  return {
    kind: 'neighbour',
    rates: [
      // Iowa Farm Custom Rate Survey 2024 (AgDM A3-10) planting average $25.25/acre.
      { workTypeId: 'plant', label: 'Planting', unit: 'acre', chargeType: 'custom', pricePerUnit: '25.25' },
      {
        workTypeId: 'mow',
        label: 'Hay mowing',
        unit: 'acre',
        chargeType: 'custom',
        // A3-10 2024 hay mowing average $13.85/acre.
        pricePerUnit: '13.85',
        minimumCharge: { amount: '50.00', per: 'visit' },
      },
      {
        workTypeId: 'bale',
        label: 'Large round bales',
        unit: 'each',
        chargeType: 'custom',
        pricePerUnit: '10.80',
        minimumCharge: { amount: '75.00', per: 'entry' },
      },
      {
        workTypeId: 'tractor-75',
        label: 'Tractor rental, 75 hp',
        unit: 'hour',
        chargeType: 'rental',
        // MSU Custom Machine and Work Rate Estimates 2011-12: $0.24 per hp-hour without driver or fuel.
        pricePerUnit: '18.00',
        // MSU Custom Work Costs 2023: unskilled labour $21.76/h; factor 1.1 per A3-29 via Growing Produce.
        operator: { wagePerHour: '21.76', laborFactor: '1.1' },
      },
      { workTypeId: 'disk-rent', label: 'Disk rental', unit: 'acre', chargeType: 'rental', pricePerUnit: '6.00' },
    ],
    ...overrides,
  };
}

function visit(entries: Visit['entries'], extra: Partial<Visit> = {}): Visit {
  return { visitId: 'v1', partyId: 'p-hill', entries, ...extra };
}

function amounts(priced: PricedVisit): Record<string, string[]> {
  const byKind: Record<string, string[]> = {};
  for (const item of priced.lines) (byKind[item.kind] ??= []).push(item.amount);
  return byKind;
}

describe('priceVisitOrThrow: quantities and minimums', () => {
  it('prices acres at the rate and rounds the line half-up to the cent', () => {
    // 40.5 × 25.25 = 1,022.625 → 1,022.63.
    const priced = priceVisitOrThrow(neighbourSheet(), visit([{ entryId: 'e1', workTypeId: 'plant', quantity: '40.5' }]));
    expect(priced.lines).toEqual([
      {
        kind: 'work',
        entryId: 'e1',
        workTypeId: 'plant',
        label: 'Planting',
        quantity: '40.5',
        unit: 'acre',
        unitPrice: '25.25',
        amount: '1022.63',
      },
    ]);
    expect(priced.total).toBe('1022.63');
    expect(priced.sheetKind).toBe('neighbour');
  });

  it('tops a small entry up to its minimum', () => {
    // 4 bales × 10.80 = 43.20, minimum 75.00 → 31.80 more.
    const priced = priceVisitOrThrow(neighbourSheet(), visit([{ entryId: 'e1', workTypeId: 'bale', quantity: 4 }]));
    expect(amounts(priced)).toEqual({ work: ['43.20'], 'minimum-charge': ['31.80'] });
    expect(priced.total).toBe('75.00');
  });

  it('applies a per-visit minimum once to all entries of that job on the trip', () => {
    // 1.5 × 13.85 = 20.775 → 20.78; 1 × 13.85 = 13.85; together 34.63, minimum 50 → 15.37.
    const priced = priceVisitOrThrow(
      neighbourSheet(),
      visit([
        { entryId: 'e1', workTypeId: 'mow', quantity: '1.5' },
        { entryId: 'e2', workTypeId: 'mow', quantity: '1' },
      ]),
    );
    expect(amounts(priced)).toEqual({ work: ['20.78', '13.85'], 'minimum-charge': ['15.37'] });
    const minimum = priced.lines.find((item) => item.kind === 'minimum-charge');
    expect(minimum?.entryId).toBeNull();
    expect(minimum?.workTypeId).toBe('mow');
    expect(priced.total).toBe('50.00');
  });

  it('adds no minimum once the work earns more than it', () => {
    // 10 × 13.85 = 138.50.
    const priced = priceVisitOrThrow(neighbourSheet(), visit([{ entryId: 'e1', workTypeId: 'mow', quantity: 10 }]));
    expect(amounts(priced)).toEqual({ work: ['138.50'] });
  });
});

describe('priceVisitOrThrow: travel', () => {
  it('charges a flat trip fee and mileage once per visit', () => {
    // 25.00 flat + 12.5 mi × 2.10 = 26.25; work 20 × 25.25 = 505.00 + 5 × 25.25 = 126.25.
    const priced = priceVisitOrThrow(
      neighbourSheet({ travel: { flatPerVisit: '25.00', perMile: '2.10' } }),
      visit(
        [
          { entryId: 'e1', workTypeId: 'plant', quantity: 20 },
          { entryId: 'e2', workTypeId: 'plant', quantity: 5 },
        ],
        { travelMiles: '12.5' },
      ),
    );
    expect(amounts(priced)).toEqual({ work: ['505.00', '126.25'], 'travel-flat': ['25.00'], 'travel-mileage': ['26.25'] });
    expect(priced.total).toBe('682.50');
  });
});

describe('priceVisitOrThrow: fuel adjustment', () => {
  // 1 % per $0.10/gal is how the sheet is set up here; Iowa State A3-10 (2014)
  // reports that a $0.50/gal diesel change moves machinery cost by about 5 %.
  const percentSheet = neighbourSheet({
    fuelAdjustment: { baseDieselPricePerGallon: '3.50', stepPerGallon: '0.10', change: { kind: 'percent', pctPerStep: '1' } },
  });

  it('counts whole steps only, toward zero (common practice, no source)', () => {
    const adjustment = percentSheet.fuelAdjustment!;
    expect(fuelAdjustmentSteps(adjustment, '3.85').toString()).toBe('3');
    expect(fuelAdjustmentSteps(adjustment, '3.59').toString()).toBe('0');
    expect(fuelAdjustmentSteps(adjustment, '3.31').toString()).toBe('-1');
  });

  it('adds a percentage per step of diesel above the base price', () => {
    // 80 acres × 25.25 = 2,020.00; 3 steps × 1 % = 60.60.
    const priced = priceVisitOrThrow(
      percentSheet,
      visit([{ entryId: 'e1', workTypeId: 'plant', quantity: 80 }], { dieselPricePerGallon: '3.85' }),
    );
    expect(amounts(priced)).toEqual({ work: ['2020.00'], 'fuel-adjustment': ['60.60'] });
    expect(priced.total).toBe('2080.60');
  });

  it('takes a percentage off when diesel falls below the base', () => {
    // 2 steps down × 1 % of 2,020.00 = −40.40.
    const priced = priceVisitOrThrow(
      percentSheet,
      visit([{ entryId: 'e1', workTypeId: 'plant', quantity: 80 }], { dieselPricePerGallon: '3.30' }),
    );
    expect(amounts(priced)['fuel-adjustment']).toEqual(['-40.40']);
  });

  it('adds a fixed amount per unit per step when the sheet says so', () => {
    // 2 steps × $0.25 = $0.50/acre on 80 acres = 40.00.
    const priced = priceVisitOrThrow(
      neighbourSheet({
        fuelAdjustment: { baseDieselPricePerGallon: '3.50', stepPerGallon: '0.10', change: { kind: 'per-unit', amountPerStep: '0.25' } },
      }),
      visit([{ entryId: 'e1', workTypeId: 'plant', quantity: 80 }], { dieselPricePerGallon: '3.72' }),
    );
    expect(amounts(priced)['fuel-adjustment']).toEqual(['40.00']);
  });

  it('follows diesel down step by step', () => {
    // 34 steps below base × 1 % = −34 % of 10 × 25.25 = −85.85.
    const priced = priceVisitOrThrow(
      percentSheet,
      visit([{ entryId: 'e1', workTypeId: 'plant', quantity: 10 }], { dieselPricePerGallon: '0.10' }),
    );
    expect(amounts(priced)['fuel-adjustment']).toEqual(['-85.85']);
  });

  it('never drives the work below zero however far diesel falls', () => {
    // 34 steps × 5 % = −170 %, held at −100 %.
    const priced = priceVisitOrThrow(
      neighbourSheet({
        fuelAdjustment: { baseDieselPricePerGallon: '3.50', stepPerGallon: '0.10', change: { kind: 'percent', pctPerStep: '5' } },
      }),
      visit([{ entryId: 'e1', workTypeId: 'plant', quantity: 10 }], { dieselPricePerGallon: '0.10' }),
    );
    expect(amounts(priced)).toEqual({ work: ['252.50'], 'fuel-adjustment': ['-252.50'] });
    expect(priced.total).toBe('0.00');
  });

  it('leaves rentals alone, since the renter buys the fuel (A3-10 2014: rental rates exclude fuel)', () => {
    const priced = priceVisitOrThrow(
      percentSheet,
      visit([{ entryId: 'e1', workTypeId: 'disk-rent', quantity: 50 }], { dieselPricePerGallon: '4.50' }),
    );
    expect(amounts(priced)).toEqual({ work: ['300.00'] });
  });

  it('asks for the diesel price when the sheet adjusts for fuel', () => {
    expect(() => priceVisitOrThrow(percentSheet, visit([{ entryId: 'e1', workTypeId: 'plant', quantity: 1 }]))).toThrow(
      /diesel price/,
    );
  });
});

describe('priceVisitOrThrow: custom versus rental', () => {
  it('bills a rental operator as machine hours × labour factor at the wage', () => {
    // 8 h × 18.00 = 144.00; operator 8 × 1.1 = 8.8 h × 21.76 = 191.488 → 191.49.
    const priced = priceVisitOrThrow(
      neighbourSheet(),
      visit([{ entryId: 'e1', workTypeId: 'tractor-75', quantity: 8, withOperator: true }]),
    );
    expect(amounts(priced)).toEqual({ work: ['144.00'], 'operator-labor': ['191.49'] });
    const operator = priced.lines.find((item) => item.kind === 'operator-labor');
    expect(operator?.quantity).toBe('8.8');
    expect(operator?.unitPrice).toBe('21.76');
  });

  it('bills a rental without operator as the machine alone', () => {
    const priced = priceVisitOrThrow(neighbourSheet(), visit([{ entryId: 'e1', workTypeId: 'tractor-75', quantity: 8 }]));
    expect(amounts(priced)).toEqual({ work: ['144.00'] });
  });

  it('never adds an operator line to custom work, whose rate already includes the operator', () => {
    const priced = priceVisitOrThrow(
      neighbourSheet(),
      visit([{ entryId: 'e1', workTypeId: 'plant', quantity: 10, machineHours: 1, withOperator: true }]),
    );
    expect(amounts(priced)).toEqual({ work: ['252.50'] });
  });

  it('needs machine hours for an operator on a rental priced by the acre', () => {
    const sheet = neighbourSheet();
    const rates = sheet.rates.map((rate): Rate =>
      rate.workTypeId === 'disk-rent' ? { ...rate, operator: { wagePerHour: '20', laborFactor: '1.2' } } : rate,
    );
    const entry = { entryId: 'e1', workTypeId: 'disk-rent', quantity: 50, withOperator: true };
    expect(() => priceVisitOrThrow({ ...sheet, rates }, visit([entry]))).toThrow(/machine hours/);
    // 5 h × 1.2 = 6 h × 20 = 120.00.
    const priced = priceVisitOrThrow({ ...sheet, rates }, visit([{ ...entry, machineHours: 5 }]));
    expect(amounts(priced)['operator-labor']).toEqual(['120.00']);
  });

  it('refuses an operator on a rental that offers none', () => {
    expect(() =>
      priceVisitOrThrow(neighbourSheet(), visit([{ entryId: 'e1', workTypeId: 'disk-rent', quantity: 5, withOperator: true }])),
    ).toThrow(/without an operator/);
  });
});

describe('rates and party overrides', () => {
  const sheet = neighbourSheet({
    kind: 'family',
    partyOverrides: [{ partyId: 'p-kin', workTypeId: 'mow', pricePerUnit: '9.00', minimumCharge: null }],
  });

  it('uses the party price and waives the minimum for that party only', () => {
    const kin = priceVisitOrThrow(sheet, visit([{ entryId: 'e1', workTypeId: 'mow', quantity: 2 }], { partyId: 'p-kin' }));
    expect(amounts(kin)).toEqual({ work: ['18.00'] });
    const other = priceVisitOrThrow(sheet, visit([{ entryId: 'e1', workTypeId: 'mow', quantity: 2 }]));
    expect(amounts(other)).toEqual({ work: ['27.70'], 'minimum-charge': ['22.30'] });
  });

  it('keeps the sheet minimum when the override does not mention one', () => {
    const partial = neighbourSheet({ partyOverrides: [{ partyId: 'p-kin', workTypeId: 'mow', pricePerUnit: '9.00' }] });
    expect(resolveRateOrThrow(partial, 'mow', 'p-kin').minimumCharge?.amount.toString()).toBe('50');
  });

  it('refuses work with no rate on the sheet', () => {
    expect(() => priceVisitOrThrow(sheet, visit([{ entryId: 'e1', workTypeId: 'snow', quantity: 1 }]))).toThrow(
      /no rate for work type "snow"/,
    );
  });

  it('refuses a negative quantity', () => {
    expect(() => priceVisitOrThrow(sheet, visit([{ entryId: 'e1', workTypeId: 'plant', quantity: -1 }]))).toThrow(
      /negative/,
    );
  });
});

describe('pricing properties', () => {
  const workTypes = ['plant', 'mow', 'bale', 'tractor-75', 'disk-rent'];
  const quantityArb = fc.integer({ min: 0, max: 500_000 }).map((thousandths) => new Decimal(thousandths).div(1000).toString());
  const sheetArb = fc.record({
    pctPerStep: fc.integer({ min: 0, max: 20 }).map(String),
    diesel: fc.integer({ min: 0, max: 800 }).map((cents) => new Decimal(cents).div(100).toString()),
    flat: fc.integer({ min: 0, max: 5000 }).map((cents) => new Decimal(cents).div(100).toString()),
  });

  function priceOne(settings: { pctPerStep: string; diesel: string; flat: string }, workTypeId: string, quantity: string) {
    const sheet = neighbourSheet({
      travel: { flatPerVisit: settings.flat, perMile: '1.95' },
      fuelAdjustment: { baseDieselPricePerGallon: '3.50', stepPerGallon: '0.10', change: { kind: 'percent', pctPerStep: settings.pctPerStep } },
    });
    return priceVisitOrThrow(
      sheet,
      visit([{ entryId: 'e1', workTypeId, quantity, withOperator: workTypeId === 'tractor-75' }], {
        dieselPricePerGallon: settings.diesel,
        travelMiles: '7.5',
      }),
    );
  }

  it('never charges less for more work', () => {
    fc.assert(
      fc.property(sheetArb, fc.constantFrom(...workTypes), quantityArb, quantityArb, (settings, workTypeId, a, b) => {
        const [less, more] = new Decimal(a).lte(b) ? [a, b] : [b, a];
        const low = new Decimal(priceOne(settings, workTypeId, less).total);
        const high = new Decimal(priceOne(settings, workTypeId, more).total);
        expect(low.lte(high)).toBe(true);
      }),
    );
  });

  it('totals exactly the sum of whole-cent lines, each quantity × unit price rounded half-up', () => {
    fc.assert(
      fc.property(sheetArb, fc.constantFrom(...workTypes), quantityArb, (settings, workTypeId, quantity) => {
        const priced = priceOne(settings, workTypeId, quantity);
        let sum = new Decimal(0);
        for (const item of priced.lines) {
          const expected = new Decimal(item.quantity).times(item.unitPrice).toDecimalPlaces(2, Decimal.ROUND_HALF_UP);
          expect(item.amount).toBe(expected.toFixed(2));
          sum = sum.plus(item.amount);
        }
        expect(priced.total).toBe(sum.toFixed(2));
      }),
    );
  });
});
