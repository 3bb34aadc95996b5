import { machineClassOrThrow, MACHINE_CLASS_IDS, type MachineKind } from '@hitchbook/shared/machine-classes';
import type { MachineCreateInput, MachineDto, MachineStatus, MachineUpdateInput } from '@hitchbook/shared/schemas/machines';
import type { ShareLineValues } from './shares';

/** Every field as typed: text until the request is built, so no number is rounded on the way. */
export interface MachineFormValues {
  name: string;
  classId: string;
  make: string;
  model: string;
  year: string;
  serialNumber: string;
  unitNumber: string;
  ptoHp: string;
  fuelType: string;
  widthFt: string;
  listPrice: string;
  purchasePrice: string;
  purchaseDate: string;
  hoursAtPurchase: string;
  plannedYearsOwned: string;
  plannedHoursPerYear: string;
  status: MachineStatus;
  notes: string;
  /** Only when adding a machine; later changes go through the owners panel with an effective date. */
  owners: ShareLineValues[];
}

export function kindOfClass(classId: string): MachineKind | null {
  return (MACHINE_CLASS_IDS as readonly string[]).includes(classId) ? machineClassOrThrow(classId).kind : null;
}

const text = (value: string | number | null | undefined) => (value === null || value === undefined ? '' : String(value));

export function machineFormValues(machine: MachineDto | null): MachineFormValues {
  return {
    name: text(machine?.name),
    classId: text(machine?.classId),
    make: text(machine?.make),
    model: text(machine?.model),
    year: text(machine?.year),
    serialNumber: text(machine?.serialNumber),
    unitNumber: text(machine?.unitNumber),
    ptoHp: text(machine?.ptoHp),
    fuelType: text(machine?.fuelType),
    widthFt: text(machine?.widthFt),
    listPrice: text(machine?.listPrice),
    purchasePrice: text(machine?.purchasePrice),
    purchaseDate: text(machine?.purchaseDate),
    hoursAtPurchase: text(machine?.hoursAtPurchase),
    plannedYearsOwned: text(machine?.plannedYearsOwned),
    plannedHoursPerYear: text(machine?.plannedHoursPerYear),
    status: machine?.status ?? 'active',
    notes: text(machine?.notes),
    owners: [],
  };
}

const orNull = (value: string) => (value.trim() ? value.trim() : null);

function sharedPayload(values: MachineFormValues) {
  const engine = kindOfClass(values.classId) !== 'implement';
  return {
    name: values.name,
    // Left undefined when empty so the schema says "Required" rather than listing every class.
    classId: (values.classId || undefined) as MachineCreateInput['classId'],
    make: orNull(values.make),
    model: orNull(values.model),
    year: orNull(values.year),
    serialNumber: orNull(values.serialNumber),
    unitNumber: orNull(values.unitNumber),
    // An implement has no engine: its PTO and fuel fields are hidden and sent empty.
    ptoHp: engine ? orNull(values.ptoHp) : null,
    fuelType: (engine ? orNull(values.fuelType) : null) as MachineCreateInput['fuelType'],
    widthFt: orNull(values.widthFt),
    listPrice: orNull(values.listPrice),
    purchasePrice: orNull(values.purchasePrice),
    purchaseDate: orNull(values.purchaseDate),
    hoursAtPurchase: values.hoursAtPurchase.trim() || undefined,
    plannedYearsOwned: orNull(values.plannedYearsOwned),
    plannedHoursPerYear: orNull(values.plannedHoursPerYear),
    notes: orNull(values.notes),
  };
}

export function machineCreatePayload(values: MachineFormValues): MachineCreateInput {
  const owners = values.owners.filter((line) => line.partyId || line.sharePct.trim());
  return {
    ...sharedPayload(values),
    owners: owners.length > 0 ? owners.map((line) => ({ partyId: line.partyId, sharePct: line.sharePct.trim() })) : undefined,
  };
}

export function machineUpdatePayload(values: MachineFormValues): MachineUpdateInput {
  return { ...sharedPayload(values), status: values.status };
}
