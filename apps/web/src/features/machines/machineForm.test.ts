import { describe, expect, it } from 'vitest';
import { machineCreateSchema } from '@hitchbook/shared/schemas/machines';
import { machineCreatePayload, machineFormValues, machineUpdatePayload } from './machineForm';

function tractor() {
  return { ...machineFormValues(null), name: 'Orwin 7R', classId: 'tractor-mfwd', ptoHp: '225', fuelType: 'diesel', listPrice: '312000.00' };
}

describe('machine form payload', () => {
  it('sends money and quantities as the typed decimal strings', () => {
    const payload = machineCreatePayload(tractor());
    expect(payload.listPrice).toBe('312000.00');
    expect(payload.ptoHp).toBe('225');
    expect(machineCreateSchema.safeParse(payload).success).toBe(true);
  });

  it('is refused by the shared schema when a power unit has no PTO horsepower', () => {
    const result = machineCreateSchema.safeParse(machineCreatePayload({ ...tractor(), ptoHp: '' }));
    expect(result.success).toBe(false);
    expect(result.error?.issues.map((i) => i.path.join('.'))).toContain('ptoHp');
  });

  it('clears the engine fields of an implement even when they were typed before the class changed', () => {
    const payload = machineCreatePayload({ ...tractor(), name: '24-ft tandem disk', classId: 'tandem-disk', widthFt: '24' });
    expect(payload.ptoHp).toBeNull();
    expect(payload.fuelType).toBeNull();
    expect(machineCreateSchema.safeParse(payload).success).toBe(true);
  });

  it('leaves the owners out when none were named, and keeps the named ones', () => {
    expect(machineCreatePayload(tractor()).owners).toBeUndefined();
    const owners = [
      { partyId: '0b6f1c2e-5d1a-4c5e-9a55-2f0d9a3b1c01', sharePct: '50' },
      { partyId: '0b6f1c2e-5d1a-4c5e-9a55-2f0d9a3b1c02', sharePct: '50' },
      { partyId: '', sharePct: '' },
    ];
    expect(machineCreatePayload({ ...tractor(), owners }).owners).toEqual(owners.slice(0, 2));
  });

  it('says which field is missing when no class is picked', () => {
    const result = machineCreateSchema.safeParse(machineCreatePayload({ ...tractor(), classId: '' }));
    expect(result.error?.issues.find((i) => i.path[0] === 'classId')?.message).toBe('Required');
  });

  it('sends the status on an edit', () => {
    expect(machineUpdatePayload({ ...tractor(), status: 'sold' }).status).toBe('sold');
  });
});
