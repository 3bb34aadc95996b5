import type { Machine, MeterReading } from '@hitchbook/db';
import { Decimal } from 'decimal.js';
import { machineClassOrThrow, type MachineClassId } from '@hitchbook/shared/machine-classes';
import type { MachineDto, MachineOwnerDto } from '@hitchbook/shared/schemas/machines';
import type { ShareRow } from './shares.repository.js';

export const toOwnerDto = (row: ShareRow): MachineOwnerDto => ({ partyId: row.partyId, name: row.partyName, sharePct: row.sharePct });

/** Prices are money: they are left out of the response altogether for roles that see no money. */
export function toMachineDto(row: Machine, owners: readonly ShareRow[], withMoney: boolean, lastReading?: MeterReading | null): MachineDto {
  const dto: MachineDto = {
    id: row.id,
    name: row.name,
    classId: row.classId as MachineClassId,
    classLabel: machineClassOrThrow(row.classId).label,
    kind: row.kind,
    make: row.make,
    model: row.model,
    year: row.year,
    serialNumber: row.serialNumber,
    unitNumber: row.unitNumber,
    ptoHp: row.ptoHp,
    fuelType: row.fuelType,
    widthFt: row.widthFt,
    purchaseDate: row.purchaseDate,
    hoursAtPurchase: row.hoursAtPurchase,
    plannedYearsOwned: row.plannedYearsOwned,
    plannedHoursPerYear: row.plannedHoursPerYear,
    speedMph: row.speedMph,
    fieldEfficiencyPct: row.fieldEfficiencyPct,
    repairFactor1: row.repairFactor1,
    repairFactor2: row.repairFactor2,
    status: row.status,
    photoUploadId: row.photoUploadId,
    notes: row.notes,
    owners: owners.map(toOwnerDto),
    ...(lastReading !== undefined && { lastReading: lastReading && lastReadingDto(lastReading) }),
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
  if (withMoney) {
    dto.listPrice = row.listPrice;
    dto.purchasePrice = row.purchasePrice;
  }
  return dto;
}

function lastReadingDto(r: MeterReading): NonNullable<MachineDto['lastReading']> {
  return { readAt: r.readAt.toISOString(), hours: r.hours, totalHours: new Decimal(r.offsetHours).plus(r.hours).toFixed(1) };
}
