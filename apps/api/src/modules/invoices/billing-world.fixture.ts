import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { fields, machines, rateSheetLines, rateSheets, workEntries, workTypes, type Database, type NewRateSheet } from '@hitchbook/db';

/** The parts of a test operation the billing rows need. */
interface OperationRef {
  operationId: string;
  members: { operator: { userId: string } };
}

/** Made-up work types, fields and machines for one test operation, so billing tests arrange their own rows. */
export interface BillingWorld<F extends OperationRef = OperationRef> {
  fx: F;
  workTypes: { mowing: string; roadside: string; hauling: string; cart: string };
  fields: { creekBottom: string; schoolhouse: string; ditch: string };
  machines: { tractor: string; mower: string };
}

export async function createBillingWorld<F extends OperationRef>(db: Database, fx: F): Promise<BillingWorld<F>> {
  const operationId = fx.operationId;
  // The operation may already carry the default work types; these keys are among them.
  await db
    .insert(workTypes)
    .values([
      { operationId, key: 'mowing-rotary', name: 'Mowing (rotary)', defaultUnit: 'acre' },
      { operationId, key: 'roadside-mowing', name: 'Roadside mowing', defaultUnit: 'mile' },
      { operationId, key: 'hauling', name: 'Hauling', defaultUnit: 'load' },
      { operationId, key: 'grain-cart', name: 'Grain cart', defaultUnit: 'hour' },
    ])
    .onConflictDoNothing();
  const typeRows = await db.select({ id: workTypes.id, key: workTypes.key }).from(workTypes).where(eq(workTypes.operationId, operationId));
  const typeId = (key: string) => typeRows.find((r) => r.key === key)!.id;
  const fl = await db
    .insert(fields)
    .values([
      { operationId, name: 'Creek Bottom', acres: '38.500' },
      { operationId, name: 'Schoolhouse 80', acres: '80.000' },
      { operationId, kind: 'roadside', name: 'Tamarack Road ditch', acres: '3.030', lengthMiles: '2.500', widthFt: '10.00' },
    ])
    .returning({ id: fields.id });
  const mc = await db
    .insert(machines)
    .values([
      { operationId, name: 'Tractor 7', classId: 'tractor-mfwd', kind: 'power' },
      { operationId, name: 'Rotary cutter 15 ft', classId: 'rotary-mower', kind: 'implement' },
    ])
    .returning({ id: machines.id });
  return {
    fx,
    workTypes: { mowing: typeId('mowing-rotary'), roadside: typeId('roadside-mowing'), hauling: typeId('hauling'), cart: typeId('grain-cart') },
    fields: { creekBottom: fl[0]!.id, schoolhouse: fl[1]!.id, ditch: fl[2]!.id },
    machines: { tractor: mc[0]!.id, mower: mc[1]!.id },
  };
}

export interface EntrySpec {
  workDate: string;
  workTypeId: string;
  fieldId: string;
  billToPartyId: string;
  hours: string;
  acres?: string;
  miles?: string;
  loads?: string;
  state?: 'draft' | 'submitted' | 'approved' | 'invoiced' | 'squared';
}

export async function addEntry(db: Database, world: BillingWorld, spec: EntrySpec): Promise<string> {
  const [row] = await db
    .insert(workEntries)
    .values({
      operationId: world.fx.operationId,
      operatorUserId: world.fx.members.operator.userId,
      powerMachineId: world.machines.tractor,
      implementMachineId: world.machines.mower,
      state: 'approved',
      clientId: randomUUID(),
      ...spec,
    })
    .returning({ id: workEntries.id });
  return row!.id;
}

export interface SheetSpec extends Partial<Omit<NewRateSheet, 'operationId'>> {
  lines: Array<{ workTypeId: string; unit: 'acre' | 'hour' | 'mile' | 'load' | 'each'; rate: string; chargeType?: 'custom' | 'rental'; minimumCharge?: string | null }>;
}

/** A sheet written straight to the database, for tests about invoices rather than about sheets. */
export async function addSheet(db: Database, world: BillingWorld, spec: SheetSpec): Promise<string> {
  const { lines, ...sheet } = spec;
  const [row] = await db
    .insert(rateSheets)
    .values({ name: 'Neighbour rates', relationship: 'neighbour', effectiveFrom: '2025-01-01', termsDays: 30, ...sheet, operationId: world.fx.operationId })
    .returning({ id: rateSheets.id });
  if (lines.length > 0) {
    await db.insert(rateSheetLines).values(lines.map((l) => ({ chargeType: 'custom' as const, ...l, operationId: world.fx.operationId, rateSheetId: row!.id })));
  }
  return row!.id;
}

/**
 * The neighbour sheet most billing tests use: mowing 18.50 per acre with a 75.00 minimum per entry,
 * roadside mowing 45.00 per mile, hauling 12.00 per load, 25.00 travel per visit, due in 21 days.
 */
export function addNeighbourSheet(db: Database, world: BillingWorld, extra: Partial<SheetSpec> = {}): Promise<string> {
  return addSheet(db, world, {
    name: 'Neighbour rates 2025',
    minimumCharge: '75.00',
    travelFlat: '25.00',
    termsDays: 21,
    lines: [
      { workTypeId: world.workTypes.mowing, unit: 'acre', rate: '18.5000' },
      { workTypeId: world.workTypes.roadside, unit: 'mile', rate: '45.0000' },
      { workTypeId: world.workTypes.hauling, unit: 'load', rate: '12.0000' },
    ],
    ...extra,
  });
}
