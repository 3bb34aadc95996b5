import type { Decimal } from 'decimal.js';
import { Dec, parseDecimalOrThrow, type DecimalInput } from './decimal.js';

export type LengthUnit = 'metre' | 'foot' | 'us-survey-foot' | 'mile';
export type AreaUnit = 'square-metre' | 'square-foot' | 'acre' | 'us-survey-acre' | 'hectare';

// International foot, exact since 1959 and the only US foot from 2023
// (NIST/NOAA, Federal Register 85 FR 62698, 2020).
export const METRES_PER_FOOT = new Dec('0.3048');
// Deprecated US survey foot, kept for old deeds and plats (same notice).
export const METRES_PER_US_SURVEY_FOOT = new Dec(1200).div(3937);
export const FEET_PER_MILE = new Dec(5280);
export const SQUARE_FEET_PER_ACRE = new Dec(43560);
export const SQUARE_METRES_PER_HECTARE = new Dec(10000);

const METRES_PER: Record<LengthUnit, Decimal> = {
  metre: new Dec(1),
  foot: METRES_PER_FOOT,
  'us-survey-foot': METRES_PER_US_SURVEY_FOOT,
  mile: FEET_PER_MILE.times(METRES_PER_FOOT),
};

const SQUARE_METRES_PER: Record<AreaUnit, Decimal> = {
  'square-metre': new Dec(1),
  'square-foot': METRES_PER_FOOT.pow(2),
  acre: SQUARE_FEET_PER_ACRE.times(METRES_PER_FOOT.pow(2)),
  'us-survey-acre': SQUARE_FEET_PER_ACRE.times(METRES_PER_US_SURVEY_FOOT.pow(2)),
  hectare: SQUARE_METRES_PER_HECTARE,
};

export function convertLength(value: DecimalInput, from: LengthUnit, to: LengthUnit): Decimal {
  return parseDecimalOrThrow(value, 'length').times(METRES_PER[from]).div(METRES_PER[to]);
}

export function convertArea(value: DecimalInput, from: AreaUnit, to: AreaUnit): Decimal {
  return parseDecimalOrThrow(value, 'area').times(SQUARE_METRES_PER[from]).div(SQUARE_METRES_PER[to]);
}

// 5,280 ft a mile over 43,560 ft² an acre: a strip L miles long and W feet
// wide covers L × W / 8.25 acres (used for roadside and ditch work).
export const ROAD_STRIP_DIVISOR = SQUARE_FEET_PER_ACRE.div(FEET_PER_MILE);

export function roadStripAcres(lengthMiles: DecimalInput, widthFeet: DecimalInput): Decimal {
  return parseDecimalOrThrow(lengthMiles, 'lengthMiles')
    .times(parseDecimalOrThrow(widthFeet, 'widthFeet'))
    .div(ROAD_STRIP_DIVISOR);
}
