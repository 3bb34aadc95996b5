import { describe, expect, it } from 'vitest';
import { Decimal } from 'decimal.js';
import {
  hasEngine,
  horsepowerBand,
  MACHINE_CLASSES,
  machineClassOrThrow,
  remainingValueCoefficientsOrThrow,
  type MachineClassId,
} from './machine-classes.js';

// The class ids the Hitchbook API contract promises (design/api.md, Estimates).
const PROMISED_IDS = [
  'tractor-2wd', 'tractor-mfwd', 'tractor-4wd', 'combine-sp', 'windrower-sp', 'moldboard-plow',
  'chisel-plow', 'tandem-disk', 'offset-disk', 'field-cultivator', 'row-crop-planter', 'grain-drill',
  'boom-sprayer', 'fertilizer-spreader', 'anhydrous-applicator', 'rotary-mower', 'cutter-bar-mower',
  'mower-conditioner-rotary', 'large-round-baler', 'grain-cart', 'wagon',
];

describe('machine class catalogue', () => {
  it('holds every promised class exactly once', () => {
    expect(MACHINE_CLASSES.map((machineClass) => machineClass.id).sort()).toEqual([...PROMISED_IDS].sort());
  });

  it('marks tractors as power units, harvesters as self-propelled, the rest as implements', () => {
    const kinds = Object.fromEntries(MACHINE_CLASSES.map((machineClass) => [machineClass.id, machineClass.kind]));
    expect(kinds['tractor-4wd']).toBe('power');
    expect(kinds['combine-sp']).toBe('self-propelled');
    expect(kinds['windrower-sp']).toBe('self-propelled');
    expect(kinds['chisel-plow']).toBe('implement');
    expect(hasEngine(machineClassOrThrow('tractor-mfwd'))).toBe(true);
    expect(hasEngine(machineClassOrThrow('wagon'))).toBe(false);
  });

  // RF1 × (life/1000)^RF2 should give each row's total-life repair share of
  // list; expected values are the "check" column of the trade reference §1
  // table, itself computed from ASABE D497.7 Table 3 values recalled from
  // memory. A mistyped factor breaks the match.
  it.each<[MachineClassId, string]>([
    ['tractor-2wd', '1.01'],
    ['tractor-mfwd', '1.01'],
    ['tractor-4wd', '0.77'],
    ['combine-sp', '0.40'],
    ['windrower-sp', '0.54'],
    ['moldboard-plow', '1.01'],
    ['chisel-plow', '0.74'],
    ['tandem-disk', '0.58'],
    ['offset-disk', '0.58'],
    ['field-cultivator', '0.71'],
    ['row-crop-planter', '0.75'],
    ['grain-drill', '0.75'],
    ['boom-sprayer', '0.69'],
    ['fertilizer-spreader', '0.80'],
    ['anhydrous-applicator', '0.74'],
    ['rotary-mower', '1.76'],
    ['cutter-bar-mower', '1.49'],
    ['mower-conditioner-rotary', '1.00'],
    ['large-round-baler', '0.89'],
    ['grain-cart', '0.79'],
    ['wagon', '0.79'],
  ])('reproduces the total-life repair share of %s (from memory: D497.7 Table 3)', (id, share) => {
    const machineClass = machineClassOrThrow(id);
    const computed = new Decimal(machineClass.rf1).times(
      new Decimal(machineClass.lifeHours).div(1000).pow(machineClass.rf2),
    );
    expect(computed.minus(share).abs().toNumber()).toBeLessThanOrEqual(0.006);
  });

  it('gives every field machine a typical speed and efficiency inside its range', () => {
    for (const machineClass of MACHINE_CLASSES) {
      const operation = machineClass.fieldOperation;
      if (!operation) continue;
      for (const range of [operation.speedMph, operation.efficiencyPct]) {
        expect(Number(range.low)).toBeLessThanOrEqual(Number(range.typical));
        expect(Number(range.typical)).toBeLessThanOrEqual(Number(range.high));
      }
      expect(Number(operation.efficiencyPct.high)).toBeLessThanOrEqual(100);
    }
  });

  it('refuses an unknown class id', () => {
    expect(() => machineClassOrThrow('hay-rake')).toThrow(/unknown machine class "hay-rake"/);
  });
});

describe('tractor horsepower bands', () => {
  // Band edges as the API contract states them: < 80, 80–150, > 150.
  it.each([
    [79.9, '<80'],
    [80, '80-150'],
    [150, '80-150'],
    [150.1, '>150'],
  ] as const)('puts %s hp in band %s', (hp, band) => {
    expect(horsepowerBand(hp)).toBe(band);
  });

  it('uses the large-tractor row for 180 hp and the medium row for 105 hp', () => {
    const tractor = machineClassOrThrow('tractor-2wd');
    expect(remainingValueCoefficientsOrThrow(tractor, 180).c1).toBe('0.976');
    expect(remainingValueCoefficientsOrThrow(tractor, '105').c1).toBe('0.942');
  });

  it('needs the horsepower for a tractor but not for an implement', () => {
    expect(() => remainingValueCoefficientsOrThrow(machineClassOrThrow('tractor-4wd'), null)).toThrow(/PTO horsepower/);
    expect(remainingValueCoefficientsOrThrow(machineClassOrThrow('tandem-disk'), null).c1).toBe('0.891');
  });
});
