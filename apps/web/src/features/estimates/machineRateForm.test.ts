import { describe, expect, it } from 'vitest';
import { listMachineClasses, type MachineClassResponse } from '@hitchbook/shared/estimates';
import { machineCostRequestSchema } from '@hitchbook/shared/schemas/estimates';
import { EMPTY_MACHINE_RATE, machineRateIssuePath, toMachineRatePayload, type MachineRateValues } from './machineRateForm';

/** The class as GET /api/estimates/machine-classes sends it. */
function machineClass(id: string): MachineClassResponse {
  const found = listMachineClasses().find((c) => c.id === id);
  if (!found) throw new Error(`no class ${id}`);
  return found;
}

// Trade reference §6a (Iowa State AgDM A3-29, 2015): 180-hp diesel tractor, list $150,000,
// purchase $130,000, 15 years at 400 h, 8 %; fuel $3.00 and wage $15.00 are test choices.
function a329Tractor(): MachineRateValues {
  return {
    ...EMPTY_MACHINE_RATE,
    machineClass: 'tractor-2wd',
    listPrice: '150000',
    purchasePrice: '130000',
    yearsOwned: '15',
    hoursPerYear: '400',
    interestRatePct: '8',
    salvageValue: '34500',
    ptoHp: '180',
    fuelPricePerGallon: '3.00',
    laborWagePerHour: '15.00',
  };
}

describe('machine-hour rate request', () => {
  it('builds a request the shared schema accepts for the A3-29 tractor', () => {
    const { cost, pass } = toMachineRatePayload(a329Tractor(), machineClass('tractor-2wd'));
    expect(machineCostRequestSchema.safeParse(cost).success).toBe(true);
    expect(cost).toMatchObject({ listPrice: '150000', ptoHp: '180', fuelType: 'diesel', salvageValue: '34500' });
    expect(pass).toBeUndefined();
  });

  it('leaves fuel and horsepower out for an implement', () => {
    const values = { ...a329Tractor(), machineClass: 'field-cultivator', ptoHp: '180' };
    const { cost } = toMachineRatePayload(values, machineClass('field-cultivator'));
    expect(cost.ptoHp).toBeUndefined();
    expect(cost.fuelPricePerGallon).toBeUndefined();
    expect(machineCostRequestSchema.safeParse(cost).success).toBe(true);
  });

  it('sends no trade-in value when it is blank, so the remaining-value curve applies', () => {
    const { cost } = toMachineRatePayload({ ...a329Tractor(), salvageValue: ' ' }, machineClass('tractor-2wd'));
    expect(cost.salvageValue).toBeNull();
  });

  it('adds the field-capacity request once any work-rate field is filled', () => {
    const values = { ...a329Tractor(), widthFt: '30', speedMph: '7', efficiencyPct: '85' };
    expect(toMachineRatePayload(values, machineClass('tractor-2wd')).pass).toEqual({
      widthFt: '30',
      speedMph: '7',
      efficiencyPct: '85',
    });
  });

  it('reports a blank required field as required rather than as a bad number', () => {
    const { cost } = toMachineRatePayload({ ...a329Tractor(), listPrice: '' }, machineClass('tractor-2wd'));
    const result = machineCostRequestSchema.safeParse(cost);
    expect(result.success).toBe(false);
    expect(result.error?.issues.find((i) => i.path[0] === 'listPrice')?.message).toBe('Required');
  });
});

describe('machine-hour rate issue paths', () => {
  it('puts both requests’ issues on the fields of the one form', () => {
    expect(machineRateIssuePath('cost.listPrice')).toBe('listPrice');
    expect(machineRateIssuePath('pass.widthFt')).toBe('widthFt');
    expect(machineRateIssuePath('purchasePrice')).toBe('purchasePrice');
  });
});
