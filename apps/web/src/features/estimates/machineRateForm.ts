import type { MachineClassResponse } from '@hitchbook/shared/estimates';
import { hasEngine } from '@hitchbook/shared/machine-classes';
import type { FieldCapacityRequestInput, MachineCostRequestInput } from '@hitchbook/shared/schemas/estimates';

/** Every field stays text while typed and goes to the server as a decimal string. */
export interface MachineRateValues {
  machineClass: string;
  listPrice: string;
  purchasePrice: string;
  yearsOwned: string;
  hoursPerYear: string;
  ageAtPurchase: string;
  hoursAtPurchase: string;
  interestRatePct: string;
  tihPct: string;
  salvageValue: string;
  ptoHp: string;
  fuelType: 'diesel' | 'gasoline' | 'lpg';
  fuelPricePerGallon: string;
  lubePct: string;
  laborWagePerHour: string;
  laborFactor: string;
  method: 'capital-recovery' | 'straight-line';
  widthFt: string;
  speedMph: string;
  efficiencyPct: string;
}

export const EMPTY_MACHINE_RATE: MachineRateValues = {
  machineClass: '',
  listPrice: '',
  purchasePrice: '',
  yearsOwned: '',
  hoursPerYear: '',
  ageAtPurchase: '0',
  hoursAtPurchase: '0',
  interestRatePct: '',
  tihPct: '1',
  salvageValue: '',
  ptoHp: '',
  fuelType: 'diesel',
  fuelPricePerGallon: '',
  lubePct: '15',
  laborWagePerHour: '',
  laborFactor: '1.1',
  method: 'capital-recovery',
  widthFt: '',
  speedMph: '',
  efficiencyPct: '',
};

/** Both requests the screen sends; `pass` only when some of the work rate was filled in. */
export interface MachineRatePayload {
  cost: MachineCostRequestInput;
  pass?: FieldCapacityRequestInput;
}

/** A blank field is left out, so the server applies its default or says "Required". */
const typed = (text: string): string | undefined => (text.trim() === '' ? undefined : text.trim());

/** Implements burn no fuel of their own; before a class is picked, the engine fields count. */
export function showsEngineFields(machineClass: MachineClassResponse | undefined): boolean {
  return machineClass ? hasEngine(machineClass) : true;
}

export function toMachineRatePayload(values: MachineRateValues, machineClass: MachineClassResponse | undefined): MachineRatePayload {
  const engine = showsEngineFields(machineClass);
  // Required fields may still be blank while typing; the schema check before sending names them.
  const cost: MachineCostRequestInput = {
    machineClass: typed(values.machineClass) as MachineCostRequestInput['machineClass'],
    listPrice: typed(values.listPrice) as string,
    purchasePrice: typed(values.purchasePrice) as string,
    yearsOwned: typed(values.yearsOwned) as string,
    hoursPerYear: typed(values.hoursPerYear) as string,
    ageAtPurchase: typed(values.ageAtPurchase),
    hoursAtPurchase: typed(values.hoursAtPurchase),
    interestRatePct: typed(values.interestRatePct) as string,
    tihPct: typed(values.tihPct),
    salvageValue: typed(values.salvageValue) ?? null,
    ptoHp: engine ? typed(values.ptoHp) : undefined,
    fuelType: engine ? values.fuelType : undefined,
    fuelPricePerGallon: engine ? typed(values.fuelPricePerGallon) : undefined,
    lubePct: engine ? typed(values.lubePct) : undefined,
    laborWagePerHour: typed(values.laborWagePerHour),
    laborFactor: typed(values.laborFactor),
    method: values.method,
  };
  const anyPass = [values.widthFt, values.speedMph, values.efficiencyPct].some((f) => f.trim() !== '');
  if (!anyPass) return { cost };
  return {
    cost,
    pass: {
      widthFt: typed(values.widthFt),
      speedMph: typed(values.speedMph),
      efficiencyPct: typed(values.efficiencyPct) as string,
    },
  };
}

/** Issues come back as "listPrice" from the server and as "cost.listPrice" from the combined client check. */
export function machineRateIssuePath(path: string): string {
  return path.replace(/^(cost|pass)\./, '');
}
