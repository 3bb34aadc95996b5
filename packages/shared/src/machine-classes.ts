import { parseDecimalOrThrow, type DecimalInput } from './decimal.js';
import { ComputationError } from './errors.js';

export const MACHINE_CLASS_IDS = [
  'tractor-2wd',
  'tractor-mfwd',
  'tractor-4wd',
  'combine-sp',
  'windrower-sp',
  'moldboard-plow',
  'chisel-plow',
  'tandem-disk',
  'offset-disk',
  'field-cultivator',
  'row-crop-planter',
  'grain-drill',
  'boom-sprayer',
  'fertilizer-spreader',
  'anhydrous-applicator',
  'rotary-mower',
  'cutter-bar-mower',
  'mower-conditioner-rotary',
  'large-round-baler',
  'grain-cart',
  'wagon',
] as const;

export type MachineClassId = (typeof MACHINE_CLASS_IDS)[number];
export type MachineKind = 'power' | 'implement' | 'self-propelled';
export type HorsepowerBand = '<80' | '80-150' | '>150';

// Coefficients travel as decimal strings, exactly as the published tables print them.
export interface RemainingValueCoefficients {
  c1: string;
  c2: string;
  c3: string;
}

export interface BandedRemainingValue extends RemainingValueCoefficients {
  band: HorsepowerBand;
}

export interface TypicalRange {
  low: string;
  typical: string;
  high: string;
}

export interface FieldOperationDefaults {
  speedMph: TypicalRange;
  efficiencyPct: TypicalRange;
}

export interface MachineClass {
  id: MachineClassId;
  label: string;
  kind: MachineKind;
  rf1: string;
  rf2: string;
  lifeHours: number;
  remainingValue: RemainingValueCoefficients | readonly BandedRemainingValue[];
  // null for machines whose output is not acres at a working width (tractors, carts, wagons).
  fieldOperation: FieldOperationDefaults | null;
}

// Remaining-value rows of ASABE D497 (the D497.5-onward square-root form).
// Every coefficient here is recalled, not read from the standard (trade
// reference §2, tag [M]); the tractor rows reproduce A3-29's printed 23 % and
// 37 %, the implement rows are marked LOW confidence there.
const TRACTOR_BANDS: readonly BandedRemainingValue[] = [
  { band: '<80', c1: '0.981', c2: '0.093', c3: '0.0058' },
  { band: '80-150', c1: '0.942', c2: '0.100', c3: '0.0008' },
  { band: '>150', c1: '0.976', c2: '0.119', c3: '0.0019' },
];
const RV_COMBINE = { c1: '1.132', c2: '0.165', c3: '0.0079' };
const RV_BALER = { c1: '0.852', c2: '0.101', c3: '0' };
const RV_MOWER_CONDITIONER = { c1: '0.756', c2: '0.067', c3: '0' };
// The standard's "swather and other machines" row: sprayers, spreaders, wagons, cutters.
const RV_OTHER = { c1: '0.943', c2: '0.111', c3: '0' };
const RV_PLANTER = { c1: '0.883', c2: '0.078', c3: '0' };
const RV_PLOW = { c1: '0.738', c2: '0.051', c3: '0' };
const RV_DISK = { c1: '0.891', c2: '0.110', c3: '0' };

function range(low: string, typical: string, high: string): TypicalRange {
  return { low, typical, high };
}

// Repair factors RF1/RF2 and life hours are ASABE D497 Table 3 values as
// recalled in the trade reference §1 (whole table tagged [M]; each row passes
// the RF1 × (life/1000)^RF2 ≈ total-life-repair check). Speeds and field
// efficiencies are D497 typical ranges from the reference §5 (tagged [M])
// unless a row says otherwise.
export const MACHINE_CLASSES: readonly MachineClass[] = [
  {
    id: 'tractor-2wd',
    label: 'Tractor, two-wheel drive',
    kind: 'power',
    rf1: '0.007',
    rf2: '2.0',
    lifeHours: 12000,
    remainingValue: TRACTOR_BANDS,
    fieldOperation: null,
  },
  {
    // Borrowed: D497 has no MFWD row; the reference uses the 2WD row [M].
    id: 'tractor-mfwd',
    label: 'Tractor, mechanical front-wheel drive',
    kind: 'power',
    rf1: '0.007',
    rf2: '2.0',
    lifeHours: 12000,
    remainingValue: TRACTOR_BANDS,
    fieldOperation: null,
  },
  {
    id: 'tractor-4wd',
    label: 'Tractor, four-wheel drive',
    kind: 'power',
    rf1: '0.003',
    rf2: '2.0',
    lifeHours: 16000,
    remainingValue: TRACTOR_BANDS,
    fieldOperation: null,
  },
  {
    id: 'combine-sp',
    label: 'Combine, self-propelled',
    kind: 'self-propelled',
    rf1: '0.04',
    rf2: '2.1',
    lifeHours: 3000,
    remainingValue: RV_COMBINE,
    fieldOperation: { speedMph: range('2', '3', '5'), efficiencyPct: range('65', '70', '80') },
  },
  {
    id: 'windrower-sp',
    label: 'Windrower, self-propelled',
    kind: 'self-propelled',
    rf1: '0.06',
    rf2: '2.0',
    lifeHours: 3000,
    remainingValue: RV_OTHER,
    // Not in the reference: D497 speed/efficiency for a self-propelled windrower, from memory.
    fieldOperation: { speedMph: range('3', '5', '8'), efficiencyPct: range('70', '80', '85') },
  },
  {
    id: 'moldboard-plow',
    label: 'Moldboard plow',
    kind: 'implement',
    rf1: '0.29',
    rf2: '1.8',
    lifeHours: 2000,
    remainingValue: RV_PLOW,
    fieldOperation: { speedMph: range('3', '4.5', '6'), efficiencyPct: range('70', '85', '90') },
  },
  {
    id: 'chisel-plow',
    label: 'Chisel plow',
    kind: 'implement',
    rf1: '0.28',
    rf2: '1.4',
    lifeHours: 2000,
    remainingValue: RV_PLOW,
    fieldOperation: { speedMph: range('4', '5', '6.5'), efficiencyPct: range('70', '85', '90') },
  },
  {
    id: 'tandem-disk',
    label: 'Tandem disk',
    kind: 'implement',
    rf1: '0.18',
    rf2: '1.7',
    lifeHours: 2000,
    remainingValue: RV_DISK,
    fieldOperation: { speedMph: range('4', '6', '7'), efficiencyPct: range('70', '80', '90') },
  },
  {
    id: 'offset-disk',
    label: 'Offset (heavy-duty) disk',
    kind: 'implement',
    rf1: '0.18',
    rf2: '1.7',
    lifeHours: 2000,
    remainingValue: RV_DISK,
    // Borrowed: the reference gives speed/efficiency only for the tandem disk.
    fieldOperation: { speedMph: range('4', '6', '7'), efficiencyPct: range('70', '80', '90') },
  },
  {
    id: 'field-cultivator',
    label: 'Field cultivator',
    kind: 'implement',
    rf1: '0.27',
    rf2: '1.4',
    lifeHours: 2000,
    // Borrowed: no cultivator remaining-value row in the reference; the plow (tillage) row is used.
    remainingValue: RV_PLOW,
    fieldOperation: { speedMph: range('5', '7', '8'), efficiencyPct: range('70', '85', '90') },
  },
  {
    id: 'row-crop-planter',
    label: 'Row-crop planter',
    kind: 'implement',
    rf1: '0.32',
    rf2: '2.1',
    lifeHours: 1500,
    remainingValue: RV_PLANTER,
    fieldOperation: { speedMph: range('4', '5.5', '7'), efficiencyPct: range('50', '65', '75') },
  },
  {
    id: 'grain-drill',
    label: 'Grain drill',
    kind: 'implement',
    rf1: '0.32',
    rf2: '2.1',
    lifeHours: 1500,
    remainingValue: RV_PLANTER,
    fieldOperation: { speedMph: range('4', '5', '7'), efficiencyPct: range('55', '70', '80') },
  },
  {
    id: 'boom-sprayer',
    label: 'Boom sprayer',
    kind: 'implement',
    rf1: '0.41',
    rf2: '1.3',
    lifeHours: 1500,
    remainingValue: RV_OTHER,
    fieldOperation: { speedMph: range('3', '6.5', '7'), efficiencyPct: range('50', '65', '80') },
  },
  {
    id: 'fertilizer-spreader',
    label: 'Fertilizer spreader',
    kind: 'implement',
    rf1: '0.63',
    rf2: '1.3',
    lifeHours: 1200,
    remainingValue: RV_OTHER,
    fieldOperation: { speedMph: range('5', '7', '10'), efficiencyPct: range('60', '70', '80') },
  },
  {
    // Borrowed: no D497 row for anhydrous toolbars; repair factors and life are
    // the chisel-plow row's, one of the two borrowings the reference names [M].
    id: 'anhydrous-applicator',
    label: 'Anhydrous ammonia applicator',
    kind: 'implement',
    rf1: '0.28',
    rf2: '1.4',
    lifeHours: 2000,
    remainingValue: RV_OTHER,
    // Iowa State AgDM A3-24 Table 1 rows (5-6 mph, 63-65 %), confirmed in the reference.
    fieldOperation: { speedMph: range('5', '6', '6'), efficiencyPct: range('63', '65', '65') },
  },
  {
    id: 'rotary-mower',
    label: 'Rotary mower (cutter)',
    kind: 'implement',
    rf1: '0.44',
    rf2: '2.0',
    lifeHours: 2000,
    remainingValue: RV_OTHER,
    fieldOperation: { speedMph: range('5', '7', '12'), efficiencyPct: range('75', '80', '90') },
  },
  {
    id: 'cutter-bar-mower',
    label: 'Cutter-bar mower',
    kind: 'implement',
    rf1: '0.46',
    rf2: '1.7',
    lifeHours: 2000,
    // Borrowed: no cutter-bar remaining-value row in the reference; the mower-conditioner row is used.
    remainingValue: RV_MOWER_CONDITIONER,
    fieldOperation: { speedMph: range('3', '5', '6'), efficiencyPct: range('75', '80', '85') },
  },
  {
    id: 'mower-conditioner-rotary',
    label: 'Mower-conditioner, rotary (disc)',
    kind: 'implement',
    rf1: '0.16',
    rf2: '2.0',
    lifeHours: 2500,
    remainingValue: RV_MOWER_CONDITIONER,
    // Borrowed: speed/efficiency of the rotary-mower row (not listed in the reference).
    fieldOperation: { speedMph: range('5', '7', '12'), efficiencyPct: range('75', '80', '90') },
  },
  {
    id: 'large-round-baler',
    label: 'Large round baler',
    kind: 'implement',
    rf1: '0.43',
    rf2: '1.8',
    lifeHours: 1500,
    remainingValue: RV_BALER,
    // Not in the reference: D497 speed/efficiency for a large round baler, from memory.
    fieldOperation: { speedMph: range('3', '5', '8'), efficiencyPct: range('55', '65', '75') },
  },
  {
    // Borrowed: no grain-cart row in D497; the reference uses the wagon row [M].
    id: 'grain-cart',
    label: 'Grain cart',
    kind: 'implement',
    rf1: '0.19',
    rf2: '1.3',
    lifeHours: 3000,
    remainingValue: RV_OTHER,
    fieldOperation: null,
  },
  {
    id: 'wagon',
    label: 'Wagon',
    kind: 'implement',
    rf1: '0.19',
    rf2: '1.3',
    lifeHours: 3000,
    remainingValue: RV_OTHER,
    fieldOperation: null,
  },
];

const BY_ID = new Map<string, MachineClass>(MACHINE_CLASSES.map((machineClass) => [machineClass.id, machineClass]));

export function machineClassOrThrow(id: string): MachineClass {
  const machineClass = BY_ID.get(id);
  if (!machineClass) {
    throw new ComputationError('unknown-machine-class', `unknown machine class "${id}"`);
  }
  return machineClass;
}

export function hasEngine(machineClass: Pick<MachineClass, 'kind'>): boolean {
  return machineClass.kind !== 'implement';
}

// Bands as the standard draws them: under 80 hp, 80 to 150 hp inclusive, over 150 hp.
export function horsepowerBand(ptoHp: DecimalInput): HorsepowerBand {
  const hp = parseDecimalOrThrow(ptoHp, 'ptoHp');
  if (hp.lt(80)) return '<80';
  if (hp.lte(150)) return '80-150';
  return '>150';
}

export function remainingValueCoefficientsOrThrow(
  machineClass: MachineClass,
  ptoHp: DecimalInput | null,
): RemainingValueCoefficients {
  const { remainingValue } = machineClass;
  if (!isBanded(remainingValue)) return remainingValue;
  if (ptoHp === null) {
    throw new ComputationError('invalid-argument', `${machineClass.label}: remaining value needs the PTO horsepower`);
  }
  const band = horsepowerBand(ptoHp);
  const row = remainingValue.find((candidate) => candidate.band === band);
  if (!row) {
    throw new ComputationError('invalid-argument', `${machineClass.label}: no remaining-value row for ${band} hp`);
  }
  return { c1: row.c1, c2: row.c2, c3: row.c3 };
}

function isBanded(
  remainingValue: MachineClass['remainingValue'],
): remainingValue is readonly BandedRemainingValue[] {
  return Array.isArray(remainingValue);
}
