import area from '@turf/area';
import type { Decimal } from 'decimal.js';
import { Dec } from '@hitchbook/shared/decimal';
import type { BoundaryGeometry } from '@hitchbook/shared/schemas/fields';
import { convertArea } from '@hitchbook/shared/units';

/**
 * Acres inside a boundary, measured geodesically by @turf/area (holes subtracted). Turf works on a
 * sphere of radius 6,371,008.8 m, about 0.15 % under the WGS84 ellipsoid: close enough to compare with
 * the acres a family farms by, not a survey. Square metres become international acres (4,046.8564224 m²).
 */
export function boundaryAcres(geometry: BoundaryGeometry): Decimal {
  return convertArea(new Dec(area(geometry)), 'square-metre', 'acre');
}
