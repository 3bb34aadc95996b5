import { Decimal } from 'decimal.js';

export interface OwnOrHireInputs {
  annualFixedCost: string;
  customRatePerAcre: string;
  variableCostPerAcre: string;
}

export interface CurvePoint {
  acres: number;
  own: number;
  hire: number;
}

/** Acres to plot, as multiples of the break-even, so the crossing always sits mid-chart. */
const SPAN = ['0.25', '0.375', '0.5', '0.625', '0.75', '0.875', '1', '1.25', '1.5', '1.75', '2', '2.5', '3'];

/** Owning costs fixed ÷ acres + variable per acre; hiring costs the custom rate, whatever the acres. */
export function ownCostPerAcre(inputs: OwnOrHireInputs, acres: Decimal.Value): Decimal {
  return new Decimal(inputs.annualFixedCost).div(acres).plus(inputs.variableCostPerAcre);
}

/**
 * Points for the own-versus-hire chart. Numbers are for plotting only; the break-even figure
 * printed on the page is the server's decimal string.
 */
export function ownOrHireCurve(inputs: OwnOrHireInputs, breakEvenAcres: string): CurvePoint[] {
  const breakEven = new Decimal(breakEvenAcres);
  // With no fixed cost there is no crossing; plot a plain range instead.
  const base = breakEven.gt(0) ? breakEven : new Decimal(100);
  const hire = new Decimal(inputs.customRatePerAcre).toNumber();
  return SPAN.map((factor) => {
    const acres = base.times(factor).toDecimalPlaces(1, Decimal.ROUND_HALF_UP);
    return { acres: acres.toNumber(), own: ownCostPerAcre(inputs, acres).toDecimalPlaces(2).toNumber(), hire };
  });
}
