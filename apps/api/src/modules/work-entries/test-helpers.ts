import { count, eq } from 'drizzle-orm';
import { fields, invoiceEntries, invoices, machines, meterReadings, workTypes, type Database } from '@hitchbook/db';
import type { OperationFixture } from '../../test-support/fixtures.js';

/** The machines, fields and work types the work-entry tests log against, inserted for one operation. */
export interface FleetFixture {
  tractor: string;
  windrower: string;
  cutter: string;
  disk: string;
  home40: string;
  creek80: string;
  oldPasture: string;
  townshipRoad: string;
  mowing: string;
  roadsideMowing: string;
  disking: string;
}

export async function createFleet(db: Database, fx: OperationFixture): Promise<FleetFixture> {
  const operationId = fx.operationId;
  const [tractor, windrower, cutter, disk] = await db
    .insert(machines)
    .values([
      { operationId, name: 'Red 7120', unitNumber: 'T-3', classId: 'tractor-mfwd', kind: 'power', ptoHp: '120' },
      { operationId, name: 'Swather 9', classId: 'windrower-sp', kind: 'self-propelled', widthFt: '16' },
      // 15 ft at the rotary-mower class's typical 7 mph and 80 %: 10.18 ac/h.
      { operationId, name: 'Batwing 15', classId: 'rotary-mower', kind: 'implement', widthFt: '15' },
      { operationId, name: 'Tandem 21', classId: 'tandem-disk', kind: 'implement', widthFt: '21' },
    ])
    .returning({ id: machines.id });
  const [home40, creek80, oldPasture, townshipRoad] = await db
    .insert(fields)
    .values([
      { operationId, name: 'Home 40', acres: '40.000', ownerPartyId: fx.households[0] },
      { operationId, name: 'Creek 80', acres: '78.500' },
      { operationId, name: 'Old Pasture', acres: '12.000', archivedAt: new Date('2024-12-01T00:00:00Z') },
      // 2 miles of ditch 8.25 ft wide is 2 acres (length × width / 8.25).
      { operationId, kind: 'roadside', name: 'Township Rd 12', acres: '2.000', roadName: 'Township Rd 12', lengthMiles: '2.000', widthFt: '8.25' },
    ])
    .returning({ id: fields.id });
  // createOperation gives every operation the default work types; the tests use three of them.
  const types = await db.select({ id: workTypes.id, key: workTypes.key }).from(workTypes).where(eq(workTypes.operationId, operationId));
  const typeId = (key: string) => types.find((w) => w.key === key)!.id;
  const [mowing, roadsideMowing, disking] = [typeId('mowing-rotary'), typeId('roadside-mowing'), typeId('disking')];
  return {
    tractor: tractor!.id,
    windrower: windrower!.id,
    cutter: cutter!.id,
    disk: disk!.id,
    home40: home40!.id,
    creek80: creek80!.id,
    oldPasture: oldPasture!.id,
    townshipRoad: townshipRoad!.id,
    mowing,
    roadsideMowing,
    disking,
  };
}

export async function addMeterReading(db: Database, operationId: string, machineId: string, readAt: string, hours: string): Promise<void> {
  await db.insert(meterReadings).values({ operationId, machineId, readAt: new Date(readAt), hours, source: 'manual' });
}

/** Puts the entry on an issued invoice the way billing does: one invoice_entries row locks it. */
export async function billEntry(db: Database, operationId: string, partyId: string, workEntryId: string): Promise<void> {
  const [{ n }] = (await db.select({ n: count() }).from(invoices).where(eq(invoices.operationId, operationId))) as [{ n: number }];
  const [invoice] = await db.insert(invoices).values({ operationId, partyId, status: 'issued', number: n + 1 }).returning({ id: invoices.id });
  await db.insert(invoiceEntries).values({ operationId, invoiceId: invoice!.id, workEntryId });
}
