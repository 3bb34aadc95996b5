import { describe, expect, it } from 'vitest';
import { acresPerHour, acresToHectares, fieldOperationOrThrow, hectaresPerHour, hectaresToAcres } from './field-capacity.js';

function near(actual: { toNumber(): number }, expected: number, tolerance: number): void {
  expect(Math.abs(actual.toNumber() - expected)).toBeLessThanOrEqual(tolerance);
}

describe('acresPerHour', () => {
  it('gives 20.36 A/h for a 40-ft spreader at 6 mph and 70 % (Iowa State AgDM A3-24, Table 1, prints 20.4)', () => {
    near(acresPerHour({ widthFt: 40, speedMph: 6, efficiencyPct: 70 }), 20.3636, 0.05);
  });

  it('gives 59.3 A/h for a 60-ft spreader at 12 mph and 68 % (Iowa State AgDM A3-24, Table 1)', () => {
    near(acresPerHour({ widthFt: 60, speedMph: 12, efficiencyPct: 68 }), 59.3, 0.05);
  });

  it.each([
    [100, 18.18],
    [80, 14.55],
    [60, 10.91],
  ])('gives a 30-ft pass at 5 mph and %s %% efficiency %s A/h (Progressive Forage, field efficiency article)', (pct, expected) => {
    near(acresPerHour({ widthFt: 30, speedMph: 5, efficiencyPct: pct }), expected, 0.05);
  });
});

describe('hectaresPerHour', () => {
  it('gives 7.68 ha/h for 12 m at 8 km/h and 80 % (Srivastava et al. 2006, eq. 15.1)', () => {
    near(hectaresPerHour({ widthM: 12, speedKmh: 8, efficiencyPct: 80 }), 7.68, 0.001);
  });

  it('agrees with the acre formula once units are converted (NIST foot and acre, 85 FR 62698)', () => {
    // 40 ft = 12.192 m and 6 mph = 9.656064 km/h, both exact from the foot definition.
    const metric = hectaresPerHour({ widthM: '12.192', speedKmh: '9.656064', efficiencyPct: 70 });
    const imperial = acresToHectares(acresPerHour({ widthFt: 40, speedMph: 6, efficiencyPct: 70 }));
    expect(metric.minus(imperial).abs().lt('1e-20')).toBe(true);
    expect(hectaresToAcres(metric).minus(acresPerHour({ widthFt: 40, speedMph: 6, efficiencyPct: 70 })).abs().lt('1e-20')).toBe(true);
  });
});

describe('fieldOperationOrThrow', () => {
  it('starts from the class typical values (D497 typical, from memory: field cultivator 7 mph, 85 %)', () => {
    const choice = fieldOperationOrThrow('field-cultivator');
    expect(choice.speedMph.toString()).toBe('7');
    expect(choice.efficiencyPct.toString()).toBe('85');
  });

  it('lets the operator replace either figure', () => {
    const choice = fieldOperationOrThrow('field-cultivator', { efficiencyPct: '78' });
    expect(choice.speedMph.toString()).toBe('7');
    expect(choice.efficiencyPct.toString()).toBe('78');
  });

  it('asks for both figures for a machine with no field defaults', () => {
    expect(() => fieldOperationOrThrow('grain-cart', { speedMph: 5 })).toThrow(/give both/);
    expect(fieldOperationOrThrow('grain-cart', { speedMph: 5, efficiencyPct: 60 }).speedMph.toString()).toBe('5');
  });
});
