import { describe, expect, it } from 'vitest';
import {
  breakEvenEstimate,
  fieldCapacityEstimate,
  jointOwnershipEstimate,
  listMachineClasses,
  machineCostEstimate,
} from './estimates.js';
import {
  breakEvenRequestSchema,
  fieldCapacityRequestSchema,
  jointOwnershipRequestSchema,
  machineCostRequestSchema,
} from './schemas/estimates.js';

function near(actual: string, expected: number, tolerance: number): void {
  expect(Math.abs(Number(actual) - expected)).toBeLessThanOrEqual(tolerance);
}

const BREAKDOWN_KEYS = ['capitalRecovery', 'tih', 'ownership', 'repairs', 'fuel', 'lube', 'labor', 'operating', 'total'];

// Iowa State AgDM A3-29 (2015) tractor inputs, as in the API contract example;
// fuel $3.00 and wage $15.00 are the trade reference's test choices (§6a).
function a329Request(extra: Record<string, unknown> = {}) {
  return machineCostRequestSchema.parse({
    machineClass: 'tractor-2wd',
    listPrice: '150000',
    purchasePrice: '130000',
    yearsOwned: 15,
    hoursPerYear: 400,
    interestRatePct: '8',
    ptoHp: 180,
    fuelType: 'diesel',
    fuelPricePerGallon: '3.00',
    laborWagePerHour: '15.00',
    method: 'capital-recovery',
    ...extra,
  });
}

describe('listMachineClasses', () => {
  it('answers with the contract fields plus typical field operation, coefficients as decimal strings', () => {
    const classes = listMachineClasses();
    expect(classes).toHaveLength(21);
    for (const machineClass of classes) {
      expect(Object.keys(machineClass).sort()).toEqual(['fieldOperation', 'id', 'kind', 'label', 'lifeHours', 'remainingValue', 'rf1', 'rf2']);
      expect(typeof machineClass.rf1).toBe('string');
      expect(Number.isInteger(machineClass.lifeHours)).toBe(true);
    }
  });

  it('gives tractors remaining value by horsepower band and implements one row', () => {
    const byId = Object.fromEntries(listMachineClasses().map((machineClass) => [machineClass.id, machineClass]));
    expect(byId['tractor-4wd']?.remainingValue).toEqual([
      { band: '<80', c1: '0.981', c2: '0.093', c3: '0.0058' },
      { band: '80-150', c1: '0.942', c2: '0.100', c3: '0.0008' },
      { band: '>150', c1: '0.976', c2: '0.119', c3: '0.0019' },
    ]);
    expect(byId['grain-drill']?.remainingValue).toEqual({ c1: '0.883', c2: '0.078', c3: '0' });
  });

  it('hands out copies, so a caller cannot alter the catalogue', () => {
    const first = listMachineClasses()[0]!;
    (first.remainingValue as unknown as { c1: string }[])[0]!.c1 = '9';
    expect(listMachineClasses()[0]?.remainingValue).not.toContainEqual(expect.objectContaining({ c1: '9' }));
  });
});

describe('machineCostEstimate', () => {
  it('answers in the contract shape with the documented decimals', () => {
    const response = machineCostEstimate(a329Request());
    expect(Object.keys(response).sort()).toEqual([
      'capitalRecoveryFactor',
      'fuelGallonsPerHour',
      'perHour',
      'perYear',
      'remainingValuePct',
      'salvageValue',
    ]);
    expect(Object.keys(response.perYear).sort()).toEqual([...BREAKDOWN_KEYS].sort());
    expect(Object.keys(response.perHour).sort()).toEqual([...BREAKDOWN_KEYS].sort());
    expect(response.remainingValuePct).toMatch(/^\d+\.\d{2}$/);
    expect(response.salvageValue).toMatch(/^\d+\.\d{2}$/);
    expect(response.capitalRecoveryFactor).toMatch(/^\d\.\d{6}$/);
    expect(response.fuelGallonsPerHour).toMatch(/^\d+\.\d{3}$/);
    for (const value of [...Object.values(response.perYear), ...Object.values(response.perHour)]) {
      expect(value).toMatch(/^-?\d+\.\d{2}$/);
    }
  });

  it('values the A3-29 tractor on the curve: 22.76 % of list, about $34,146 (A3-29 prints 23 %; coefficients from memory, trade reference §2)', () => {
    const response = machineCostEstimate(a329Request());
    expect(response.remainingValuePct).toBe('22.76');
    near(response.salvageValue, 34146, 1);
    // CRF(8 %, 15) = 0.1168295 (trade reference §6a, C-calc; 0.117 in A3-29's table).
    expect(response.capitalRecoveryFactor).toBe('0.116830');
    // 0.044 × 180 hp (ASAE EP496.3 §6.3.2.1 via Grisso).
    expect(response.fuelGallonsPerHour).toBe('7.920');
  });

  it('costs $86.97 an hour with salvage at 23 % of list: ownership $36.85, operating $50.12 (A3-29 inputs; computed, trade reference §6a)', () => {
    const response = machineCostEstimate(a329Request({ salvageValue: '34500' }));
    expect(response.salvageValue).toBe('34500.00');
    expect(response.remainingValuePct).toBe('23.00');
    expect(response.perHour.ownership).toBe('36.85');
    expect(response.perHour.operating).toBe('50.12');
    near(response.perHour.total, 86.97, 0.05);
    expect(response.perYear.tih).toBe('822.50');
    expect(response.perYear.capitalRecovery).toBe('13917.22');
    expect(response.perHour.repairs).toBe('6.30');
    expect(response.perHour.fuel).toBe('23.76');
    expect(response.perHour.lube).toBe('3.56');
    expect(response.perHour.labor).toBe('16.50');
  });

  it('charges an implement no fuel', () => {
    const response = machineCostEstimate(
      machineCostRequestSchema.parse({
        machineClass: 'field-cultivator',
        listPrice: '60000',
        purchasePrice: '54000',
        yearsOwned: 10,
        hoursPerYear: 150,
        interestRatePct: '6',
        method: 'straight-line',
      }),
    );
    expect(response.fuelGallonsPerHour).toBe('0.000');
    expect(response.perYear.fuel).toBe('0.00');
    expect(response.perYear.lube).toBe('0.00');
  });
});

describe('fieldCapacityEstimate', () => {
  it('gives 20.364 A/h and 8.241 ha/h for 40 ft, 6 mph, 70 % (Iowa State AgDM A3-24 Table 1 prints 20.4; hectares by the NIST acre)', () => {
    expect(fieldCapacityEstimate(fieldCapacityRequestSchema.parse({ widthFt: '40', speedMph: 6, efficiencyPct: 70 }))).toEqual({
      acresPerHour: '20.364',
      hectaresPerHour: '8.241',
    });
  });

  it('gives 7.680 ha/h for 12 m, 8 km/h, 80 % (Srivastava et al. 2006, eq. 15.1) and the same in acres', () => {
    const response = fieldCapacityEstimate(fieldCapacityRequestSchema.parse({ widthM: 12, speedKmh: 8, efficiencyPct: 80 }));
    expect(response.hectaresPerHour).toBe('7.680');
    // 7.68 ha ÷ 0.404 685 642 24 ha per acre (NIST SP 811).
    near(response.acresPerHour, 18.978, 0.001);
  });
});

describe('breakEvenEstimate', () => {
  it('breaks even at 58.82 acres (Field & Solie, "Break-Even Use": 58.8)', () => {
    const response = breakEvenEstimate(
      breakEvenRequestSchema.parse({ annualFixedCost: '1000', customRatePerAcre: '21', variableCostPerAcre: '4' }),
    );
    expect(response.breakEvenAcres).toMatch(/^\d+\.\d{2}$/);
    near(response.breakEvenAcres, 58.8, 0.1);
  });

  it('breaks even near 842 acres in CSU Fact Sheet 3.759 Problem 1 (Colorado State Univ. Extension, 2012)', () => {
    const response = breakEvenEstimate(
      breakEvenRequestSchema.parse({ annualFixedCost: 12000, customRatePerAcre: 16, variableCostPerAcre: 1.75 }),
    );
    near(response.breakEvenAcres, 842, 0.5);
  });
});

describe('jointOwnershipEstimate', () => {
  it('settles the A3-34 combine with Chris paying Al $1,797.73 (A3-34 teaching activity inputs; computed, trade reference §10)', () => {
    const request = jointOwnershipRequestSchema.parse({
      members: [
        { id: 'al', ownershipPct: '50', use: '1000' },
        { id: 'chris', ownershipPct: '50', use: '1200' },
      ],
      costs: [
        { label: 'Depreciation', amount: '15000', paidBy: { al: '7500', chris: '7500' } },
        { label: 'Interest', amount: '10500', paidBy: { al: '5250', chris: '5250' } },
        { label: 'Insurance', amount: '750', paidBy: { al: '375', chris: '375' } },
        { label: 'Housing', amount: '750', paidBy: { al: '750' } },
        { label: 'Fuel and lube', amount: '1800', paidBy: { al: '900', chris: '900' } },
        { label: 'Repairs', amount: '2500', paidBy: { al: '1250', chris: '1250' } },
      ],
      settleBy: 'use',
    });
    expect(jointOwnershipEstimate(request)).toEqual({
      totalCost: '31300.00',
      members: [
        { id: 'al', share: '14227.27', paid: '16025.00', balance: '1797.73' },
        { id: 'chris', share: '17072.73', paid: '15275.00', balance: '-1797.73' },
      ],
      transfers: [{ from: 'chris', to: 'al', amount: '1797.73' }],
    });
  });

  it('splits 1,000 and 500 acres of use into 2/3 and 1/3 (Iowa State AgDM A3-34, Joint Machinery Ownership)', () => {
    const request = jointOwnershipRequestSchema.parse({
      members: [
        { id: 'al', ownershipPct: '50', use: '1000' },
        { id: 'chris', ownershipPct: '50', use: '500' },
      ],
      costs: [{ label: 'Repairs', amount: '3000', paidBy: { al: '1500', chris: '1500' } }],
      settleBy: 'use',
    });
    const response = jointOwnershipEstimate(request);
    expect(response.members.map((member) => member.share)).toEqual(['2000.00', '1000.00']);
    expect(response.transfers).toEqual([{ from: 'al', to: 'chris', amount: '500.00' }]);
  });

  it('splits by ownership percentages when asked', () => {
    const request = jointOwnershipRequestSchema.parse({
      members: [
        { id: 'al', ownershipPct: '66.67' },
        { id: 'chris', ownershipPct: '33.33' },
      ],
      costs: [{ label: 'Repairs', amount: '3000', paidBy: { chris: '3000' } }],
      settleBy: 'ownership',
    });
    // 3,000 × 66.67 % = 2,000.10 and × 33.33 % = 999.90.
    const response = jointOwnershipEstimate(request);
    expect(response.members.map((member) => member.share)).toEqual(['2000.10', '999.90']);
    expect(response.transfers).toEqual([{ from: 'al', to: 'chris', amount: '2000.10' }]);
  });

  it('makes no transfers when there are no costs yet', () => {
    const request = jointOwnershipRequestSchema.parse({
      members: [
        { id: 'a', ownershipPct: 50, use: 1 },
        { id: 'b', ownershipPct: 50, use: 1 },
      ],
      costs: [],
      settleBy: 'use',
    });
    expect(jointOwnershipEstimate(request)).toEqual({
      totalCost: '0.00',
      members: [
        { id: 'a', share: '0.00', paid: '0.00', balance: '0.00' },
        { id: 'b', share: '0.00', paid: '0.00', balance: '0.00' },
      ],
      transfers: [],
    });
  });
});
