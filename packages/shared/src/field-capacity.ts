import type { Decimal } from 'decimal.js';
import { parseDecimalOrThrow, type DecimalInput } from './decimal.js';
import { ComputationError } from './errors.js';
import { machineClassOrThrow } from './machine-classes.js';
import { convertArea, ROAD_STRIP_DIVISOR } from './units.js';

export interface ImperialPass {
  speedMph: DecimalInput;
  widthFt: DecimalInput;
  efficiencyPct: DecimalInput;
}

export interface MetricPass {
  speedKmh: DecimalInput;
  widthM: DecimalInput;
  efficiencyPct: DecimalInput;
}

// Effective field capacity, Iowa State AgDM A3-24: mph × ft × efficiency / 8.25.
// Field efficiency leaves out road travel, daily service and breakdowns.
export function acresPerHour({ speedMph, widthFt, efficiencyPct }: ImperialPass): Decimal {
  return parseDecimalOrThrow(speedMph, 'speedMph')
    .times(parseDecimalOrThrow(widthFt, 'widthFt'))
    .times(parseDecimalOrThrow(efficiencyPct, 'efficiencyPct').div(100))
    .div(ROAD_STRIP_DIVISOR);
}

// Srivastava et al., Engineering Principles of Agricultural Machines, eq. 15.1:
// km/h × m × efficiency / 10.
export function hectaresPerHour({ speedKmh, widthM, efficiencyPct }: MetricPass): Decimal {
  return parseDecimalOrThrow(speedKmh, 'speedKmh')
    .times(parseDecimalOrThrow(widthM, 'widthM'))
    .times(parseDecimalOrThrow(efficiencyPct, 'efficiencyPct').div(100))
    .div(10);
}

export function acresToHectares(acres: DecimalInput): Decimal {
  return convertArea(acres, 'acre', 'hectare');
}

export function hectaresToAcres(hectares: DecimalInput): Decimal {
  return convertArea(hectares, 'hectare', 'acre');
}

export interface FieldOperationChoice {
  speedMph: Decimal;
  efficiencyPct: Decimal;
}

// The class's typical speed and efficiency, each replaced by the operator's own
// figure when given: the published values are a starting point, not a rule.
export function fieldOperationOrThrow(
  machineClassId: string,
  overrides: { speedMph?: DecimalInput; efficiencyPct?: DecimalInput } = {},
): FieldOperationChoice {
  const machineClass = machineClassOrThrow(machineClassId);
  const speedMph = overrides.speedMph ?? machineClass.fieldOperation?.speedMph.typical;
  const efficiencyPct = overrides.efficiencyPct ?? machineClass.fieldOperation?.efficiencyPct.typical;
  if (speedMph === undefined || efficiencyPct === undefined) {
    throw new ComputationError(
      'invalid-argument',
      `${machineClass.label} has no typical field speed or efficiency; give both`,
    );
  }
  return {
    speedMph: parseDecimalOrThrow(speedMph, 'speedMph'),
    efficiencyPct: parseDecimalOrThrow(efficiencyPct, 'efficiencyPct'),
  };
}
