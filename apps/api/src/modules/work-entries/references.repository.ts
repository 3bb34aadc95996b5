import { Inject, Injectable } from '@nestjs/common';
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import { fields, machines, memberships, meterReadings, parties, users, workTypes, type Executor } from '@hitchbook/db';
import { DB, type DbHandle } from '../../core/database.js';

// Reads a work entry needs that the fleet, field and party modules do not offer: members who run
// machines, whole catalogues for matching a CSV by name, and readings of many machines at once.
// Every query is scoped by the operation id.

export interface FieldRef {
  id: string;
  name: string;
  kind: 'field' | 'roadside';
  acres: string;
  lengthMiles: string | null;
  archived: boolean;
}

export interface MachineRef {
  id: string;
  name: string;
  unitNumber: string | null;
  classId: string;
  kind: 'power' | 'self-propelled' | 'implement';
  widthFt: string | null;
  speedMph: string | null;
  fieldEfficiencyPct: string | null;
}

export interface WorkTypeRef {
  id: string;
  key: string;
  name: string;
  archived: boolean;
}

export interface PartyRef {
  id: string;
  name: string;
  kind: 'household' | 'customer';
  archived: boolean;
}

/** A member who may run a machine: owners, partners and operators (bookkeepers and customers do not). */
export interface OperatorRef {
  userId: string;
  name: string;
  email: string;
}

export const OPERATOR_ROLES = ['owner', 'partner', 'operator'] as const;

export interface MeterReadingRef {
  readAt: Date;
  hours: string;
  kind: 'reading' | 'reset';
  offsetHours: string;
  source: string;
}

const fieldColumns = {
  id: fields.id,
  name: fields.name,
  kind: fields.kind,
  acres: fields.acres,
  lengthMiles: fields.lengthMiles,
  archived: sql<boolean>`${fields.archivedAt} is not null`,
};
const machineColumns = {
  id: machines.id,
  name: machines.name,
  unitNumber: machines.unitNumber,
  classId: machines.classId,
  kind: machines.kind,
  widthFt: machines.widthFt,
  speedMph: machines.speedMph,
  fieldEfficiencyPct: machines.fieldEfficiencyPct,
};
const workTypeColumns = { id: workTypes.id, key: workTypes.key, name: workTypes.name, archived: workTypes.archived };
const partyColumns = { id: parties.id, name: parties.name, kind: parties.kind, archived: sql<boolean>`${parties.archivedAt} is not null` };
const readingColumns = { readAt: meterReadings.readAt, hours: meterReadings.hours, kind: meterReadings.kind, offsetHours: meterReadings.offsetHours, source: meterReadings.source };

@Injectable()
export class ReferencesRepository {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  async machinesByIds(operationId: string, ids: string[], executor: Executor = this.dbh.db): Promise<MachineRef[]> {
    if (ids.length === 0) return [];
    return executor.select(machineColumns).from(machines).where(and(eq(machines.operationId, operationId), inArray(machines.id, ids)));
  }

  /** The member, when they belong to this operation with a role that runs machines. */
  async operator(operationId: string, userId: string, executor: Executor = this.dbh.db): Promise<OperatorRef | undefined> {
    const [row] = await executor
      .select({ userId: users.id, name: users.name, email: users.email })
      .from(memberships)
      .innerJoin(users, eq(users.id, memberships.userId))
      .where(and(eq(memberships.operationId, operationId), eq(memberships.userId, userId), eq(memberships.status, 'active'), inArray(memberships.role, [...OPERATOR_ROLES])));
    return row;
  }

  /** Everything an import matches names against, loaded once per file. */
  async catalogue(operationId: string, executor: Executor = this.dbh.db) {
    // One after another: inside a transaction the queries share one connection anyway.
    const fieldRows = await executor.select(fieldColumns).from(fields).where(eq(fields.operationId, operationId));
    const machineRows = await executor.select(machineColumns).from(machines).where(eq(machines.operationId, operationId));
    const workTypeRows = await executor.select(workTypeColumns).from(workTypes).where(eq(workTypes.operationId, operationId));
    const partyRows = await executor.select(partyColumns).from(parties).where(eq(parties.operationId, operationId));
    const operatorRows = await executor
      .select({ userId: users.id, name: users.name, email: users.email })
      .from(memberships)
      .innerJoin(users, eq(users.id, memberships.userId))
      .where(and(eq(memberships.operationId, operationId), eq(memberships.status, 'active'), inArray(memberships.role, [...OPERATOR_ROLES])));
    return { fields: fieldRows, machines: machineRows, workTypes: workTypeRows, parties: partyRows, operators: operatorRows };
  }

  /** Every reading of the given machines, oldest first: the import checks a whole file against them. */
  async readingsOf(operationId: string, machineIds: string[], executor: Executor = this.dbh.db): Promise<Array<MeterReadingRef & { machineId: string }>> {
    if (machineIds.length === 0) return [];
    return executor
      .select({ ...readingColumns, machineId: meterReadings.machineId })
      .from(meterReadings)
      .where(and(eq(meterReadings.operationId, operationId), inArray(meterReadings.machineId, machineIds)))
      .orderBy(asc(meterReadings.machineId), asc(meterReadings.readAt), asc(meterReadings.createdAt));
  }
}
