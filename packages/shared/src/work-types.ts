import type { CautionKey } from './cautions.js';
import type { MachineClassId } from './machine-classes.js';

/** How a kind of work is usually billed. */
export const WORK_UNITS = ['acre', 'hour', 'mile', 'load', 'each'] as const;
export type WorkUnit = (typeof WORK_UNITS)[number];

export interface DefaultWorkType {
  key: string;
  name: string;
  defaultUnit: WorkUnit;
  cautions: readonly CautionKey[];
  /** The implement (or self-propelled machine) usually doing it, for field-capacity checks. */
  typicalClassId: MachineClassId | null;
}

// Every new operation starts with these; each outfit may rename, re-unit or
// archive them. Units follow how custom work is commonly charged (common
// practice, no source): ground work per acre, roadside mowing per mile,
// hauling per load, cart and clearing work per hour.
export const DEFAULT_WORK_TYPES: readonly DefaultWorkType[] = [
  { key: 'mowing-rotary', name: 'Mowing (rotary)', defaultUnit: 'acre', cautions: ['thrown-debris', 'pto'], typicalClassId: 'rotary-mower' },
  { key: 'roadside-mowing', name: 'Roadside mowing', defaultUnit: 'mile', cautions: ['roadside', 'thrown-debris', 'pto'], typicalClassId: 'rotary-mower' },
  { key: 'disking', name: 'Disking', defaultUnit: 'acre', cautions: ['pto', 'road-travel'], typicalClassId: 'tandem-disk' },
  { key: 'field-cultivating', name: 'Field cultivating', defaultUnit: 'acre', cautions: ['pto', 'road-travel'], typicalClassId: 'field-cultivator' },
  { key: 'planting', name: 'Planting', defaultUnit: 'acre', cautions: ['pto', 'chemical'], typicalClassId: 'row-crop-planter' },
  { key: 'drilling', name: 'Drilling', defaultUnit: 'acre', cautions: ['pto', 'chemical'], typicalClassId: 'grain-drill' },
  { key: 'side-dressing', name: 'Side-dressing (liquid N)', defaultUnit: 'acre', cautions: ['chemical', 'pto'], typicalClassId: null },
  { key: 'anhydrous-application', name: 'Anhydrous application', defaultUnit: 'acre', cautions: ['anhydrous', 'road-travel'], typicalClassId: 'anhydrous-applicator' },
  { key: 'spraying', name: 'Spraying', defaultUnit: 'acre', cautions: ['chemical', 'road-travel'], typicalClassId: 'boom-sprayer' },
  { key: 'grain-cart', name: 'Grain cart', defaultUnit: 'hour', cautions: ['pto', 'road-travel'], typicalClassId: 'grain-cart' },
  { key: 'hauling', name: 'Hauling', defaultUnit: 'load', cautions: ['road-travel'], typicalClassId: 'wagon' },
  { key: 'brush-clearing', name: 'Brush clearing', defaultUnit: 'hour', cautions: ['thrown-debris', 'pto'], typicalClassId: 'rotary-mower' },
  { key: 'tiling', name: 'Tiling', defaultUnit: 'hour', cautions: ['digging'], typicalClassId: null },
  { key: 'other', name: 'Other', defaultUnit: 'hour', cautions: [], typicalClassId: null },
];

/** The rows an operation's default work types are inserted as. */
export function defaultWorkTypeRows(operationId: string) {
  return DEFAULT_WORK_TYPES.map((type) => ({
    operationId,
    key: type.key,
    name: type.name,
    defaultUnit: type.defaultUnit,
    cautions: [...type.cautions],
    typicalClassId: type.typicalClassId,
  }));
}
