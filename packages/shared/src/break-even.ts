import type { Decimal } from 'decimal.js';
import { parseDecimalOrThrow, type DecimalInput } from './decimal.js';
import { ComputationError } from './errors.js';

export interface BreakEvenInputs {
  annualFixedCost: DecimalInput;
  customRatePerAcre: DecimalInput;
  variableCostPerAcre: DecimalInput;
}

// Acres a year above which owning beats hiring: fixed cost over the saving per
// acre, F / (custom rate − own variable cost). With no saving per acre there is
// no such acreage, which is an answer the farmer needs to hear, not a number.
export function breakEvenAcresOrThrow({ annualFixedCost, customRatePerAcre, variableCostPerAcre }: BreakEvenInputs): Decimal {
  const saving = parseDecimalOrThrow(customRatePerAcre, 'customRatePerAcre').minus(
    parseDecimalOrThrow(variableCostPerAcre, 'variableCostPerAcre'),
  );
  if (saving.lte(0)) {
    throw new ComputationError(
      'custom-rate-not-above-variable-cost',
      'the custom rate must be above your own variable cost per acre, or hiring is always cheaper',
    );
  }
  return parseDecimalOrThrow(annualFixedCost, 'annualFixedCost').div(saving);
}

// A year's cost of owning and running the machine over a given acreage.
export function ownershipCost(
  inputs: Pick<BreakEvenInputs, 'annualFixedCost' | 'variableCostPerAcre'>,
  acres: DecimalInput,
): Decimal {
  return parseDecimalOrThrow(inputs.annualFixedCost, 'annualFixedCost').plus(
    parseDecimalOrThrow(inputs.variableCostPerAcre, 'variableCostPerAcre').times(parseDecimalOrThrow(acres, 'acres')),
  );
}

// Yearly gain from owning rather than hiring at a given acreage (negative: hiring wins).
export function ownershipAdvantage(inputs: BreakEvenInputs, acres: DecimalInput): Decimal {
  const hireCost = parseDecimalOrThrow(inputs.customRatePerAcre, 'customRatePerAcre').times(parseDecimalOrThrow(acres, 'acres'));
  return hireCost.minus(ownershipCost(inputs, acres));
}
