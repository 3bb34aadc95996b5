import { describe, expect, it } from 'vitest';
import { rateSheetCreateSchema, type RateSheetDto } from '@hitchbook/shared/schemas/rate-sheets';
import { emptyLine, newSheetValues, toRateSheetPayload, valuesFromSheet } from './rateSheetForm';

const MOWING = '8f1d2c1e-5b7a-4c1e-9d1a-3e2b1c0d9a01';
const TRACTOR = '5e0b9a6c-2d4f-4b8a-a1c3-7d9e0f1a2b3c';

function storedSheet(overrides: Partial<RateSheetDto> = {}): RateSheetDto {
  return {
    id: '0b6f3a1e-1111-4c1e-9d1a-3e2b1c0d9a01',
    name: 'Neighbour custom rates',
    relationship: 'neighbour',
    partyId: null,
    partyName: null,
    effectiveFrom: '2025-01-01',
    minimumCharge: '75.00',
    minimumPer: 'entry',
    travelFlat: '20.00',
    travelPerMile: '0.6500',
    fuelAdjustment: { basePricePerGallon: '3.6000', stepPerGallon: '0.2000', pctPerStep: '1.5000' },
    operatorWage: '22.00',
    laborFactor: '1.100',
    termsDays: 21,
    notes: null,
    archivedAt: null,
    createdAt: '2025-01-01T00:00:00Z',
    updatedAt: '2025-01-01T00:00:00Z',
    lines: [
      { id: 'l1', workTypeId: MOWING, workTypeName: 'Mowing (rotary)', unit: 'acre', chargeType: 'custom', rate: '18.5000', minimumCharge: null },
    ],
    machineRates: [{ id: 'm1', machineId: TRACTOR, machineName: 'Harlan 5105', ratePerHour: '52.0000' }],
    ...overrides,
  };
}

describe('rate sheet form', () => {
  it('sends a stored sheet back unchanged, decimals as the text they were', () => {
    const payload = toRateSheetPayload(valuesFromSheet(storedSheet()));
    expect(payload).toMatchObject({
      name: 'Neighbour custom rates',
      partyId: null,
      travelPerMile: '0.6500',
      fuelAdjustment: { basePricePerGallon: '3.6000', stepPerGallon: '0.2000', pctPerStep: '1.5000' },
      termsDays: 21,
      lines: [{ workTypeId: MOWING, unit: 'acre', chargeType: 'custom', rate: '18.5000', minimumCharge: null }],
      machineRates: [{ machineId: TRACTOR, ratePerHour: '52.0000' }],
    });
    expect(rateSheetCreateSchema.safeParse(payload).success).toBe(true);
  });

  it('drops the fuel adjustment when the sheet does not adjust for fuel, keeping what was typed', () => {
    const values = valuesFromSheet(storedSheet());
    const payload = toRateSheetPayload({ ...values, adjustsForFuel: false });
    expect(payload.fuelAdjustment).toBeNull();
    expect(values.fuelAdjustment.basePricePerGallon).toBe('3.6000');
  });

  it('sends a line minimum left blank as null, so the sheet minimum applies', () => {
    const values = valuesFromSheet(storedSheet());
    values.lines[0]!.minimumCharge = '  ';
    expect(toRateSheetPayload(values).lines?.[0]?.minimumCharge).toBeNull();
    values.lines[0]!.minimumCharge = '40';
    expect(toRateSheetPayload(values).lines?.[0]?.minimumCharge).toBe('40');
  });

  it('lets the schema refuse terms that are not a whole number of days', () => {
    const values = { ...valuesFromSheet(storedSheet()), termsDays: '' };
    const blank = rateSheetCreateSchema.safeParse(toRateSheetPayload(values));
    expect(blank.success).toBe(false);
    expect(blank.error?.issues.find((i) => i.path[0] === 'termsDays')?.message).toBe('Enter a whole number of days.');
    const half = rateSheetCreateSchema.safeParse(toRateSheetPayload({ ...values, termsDays: '7.5' }));
    expect(half.error?.issues.find((i) => i.path[0] === 'termsDays')?.message).toBe('Enter a whole number of days.');
  });

  it('starts a new sheet with one empty rate line that the schema asks to fill in', () => {
    const values = newSheetValues('2026-03-01');
    expect(values.effectiveFrom).toBe('2026-03-01');
    expect(values.lines).toHaveLength(1);
    const result = rateSheetCreateSchema.safeParse(toRateSheetPayload({ ...values, name: 'Spring rates' }));
    expect(result.success).toBe(false);
    expect(result.error?.issues.map((i) => i.path.join('.'))).toEqual(expect.arrayContaining(['lines.0.workTypeId', 'lines.0.rate']));
  });

  it('gives every new row its own key', () => {
    expect(emptyLine().key).not.toBe(emptyLine().key);
  });
});
