import { Inject, Injectable } from '@nestjs/common';
import type { Decimal } from 'decimal.js';
import type { Executor, MeterReading } from '@hitchbook/db';
import { Dec } from '@hitchbook/shared/decimal';
import type { Page } from '@hitchbook/shared/schemas/common';
import type { MeterReadingCreate, MeterReadingDto, MeterReadingKind } from '@hitchbook/shared/schemas/machines';
import type { Actor } from '../../common/auth/actor.js';
import { invalid, notFound } from '../../common/errors/app-error.js';
import { AuditService } from '../../core/audit.service.js';
import { DB, type DbHandle } from '../../core/database.js';
import { MachineAccess } from './machine-access.js';
import { MachinesRepository } from './machines.repository.js';
import { MeterReadingsRepository } from './meter-readings.repository.js';

export interface MeterReadingToRecord {
  readAt: Date;
  hours: Decimal;
  kind: MeterReadingKind;
  /** Resets only; defaults to the machine's total hours at the reading before. */
  offsetHours?: Decimal;
  source: MeterReading['source'];
  workEntryId?: string | null;
  note?: string | null;
  createdBy: string | null;
}

const totalOf = (r: MeterReading) => new Dec(r.offsetHours).plus(r.hours);
const hoursText = (value: Decimal | string) => `${new Dec(value).toFixed(1)} h`;
const when = (at: Date) => `${at.toISOString().slice(0, 16).replace('T', ' ')} UTC`;

export function toMeterReadingDto(r: MeterReading): MeterReadingDto {
  return {
    id: r.id,
    readAt: r.readAt.toISOString(),
    hours: r.hours,
    kind: r.kind,
    offsetHours: r.offsetHours,
    totalHours: totalOf(r).toFixed(1),
    source: r.source,
    workEntryId: r.workEntryId,
    note: r.note,
  };
}

@Injectable()
export class MeterReadingsService {
  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(MeterReadingsRepository) private readonly readings: MeterReadingsRepository,
    @Inject(MachinesRepository) private readonly machines: MachinesRepository,
    @Inject(MachineAccess) private readonly access: MachineAccess,
    @Inject(AuditService) private readonly audit: AuditService,
  ) {}

  async list(actor: Actor, machineId: string, query: { page: number; pageSize: number }): Promise<Page<MeterReadingDto>> {
    await this.access.machineOrThrow(actor, 'machine.read', machineId);
    const { rows, total } = await this.readings.page(actor.operationId, machineId, query.pageSize, (query.page - 1) * query.pageSize);
    return { items: rows.map(toMeterReadingDto), total, page: query.page, pageSize: query.pageSize };
  }

  async create(actor: Actor, machineId: string, input: MeterReadingCreate): Promise<MeterReadingDto> {
    await this.access.machineOrThrow(actor, 'meter.record', machineId);
    return this.dbh.db.transaction(async (tx) => {
      const row = await this.recordOrThrow(tx, actor.operationId, machineId, {
        readAt: input.readAt ? new Date(input.readAt) : new Date(),
        hours: input.hours,
        kind: input.kind,
        offsetHours: input.offsetHours,
        source: 'manual',
        note: input.note ?? null,
        createdBy: actor.userId,
      });
      await this.audit.record(this.audit.byActor(actor, 'meter-reading.recorded', 'machine', machineId, { after: row }), tx);
      return toMeterReadingDto(row);
    });
  }

  /**
   * Stores a reading after checking it against its neighbours in time: on one meter the hours never
   * fall, and a replaced meter (a reset) starts from an offset no lower than the hours the machine had.
   * Runs inside the caller's transaction (a work entry that reads the meter uses it too) and locks the
   * machine, so two readings cannot both pass against the same neighbours.
   */
  async recordOrThrow(tx: Executor, operationId: string, machineId: string, reading: MeterReadingToRecord): Promise<MeterReading> {
    if (!(await this.machines.lock(operationId, machineId, tx))) throw notFound('No such machine.');
    const before = await this.readings.latestAtOrBefore(operationId, machineId, reading.readAt, tx);
    const after = await this.readings.firstAfter(operationId, machineId, reading.readAt, tx);
    let offset: Decimal;
    if (reading.kind === 'reset') {
      if (after) {
        throw invalid('readAt', `A meter replacement must come after every reading on the old meter; there is one at ${when(after.readAt)} (${hoursText(after.hours)}).`);
      }
      offset = reading.offsetHours ?? (before ? totalOf(before) : new Dec(0));
      if (before && offset.lt(totalOf(before))) {
        throw invalid(
          'offsetHours',
          `The offset ${hoursText(offset)} is below the ${hoursText(totalOf(before))} the machine had at ${when(before.readAt)}; give the machine's total hours when the new meter went in.`,
        );
      }
    } else {
      offset = before ? new Dec(before.offsetHours) : new Dec(0);
      if (before && reading.hours.lt(before.hours)) {
        throw invalid(
          'hours',
          `${hoursText(reading.hours)} at ${when(reading.readAt)} is lower than the ${hoursText(before.hours)} read at ${when(before.readAt)}. A meter cannot run backwards; if it was replaced, record a reset.`,
        );
      }
      if (after && after.kind === 'reading' && reading.hours.gt(after.hours)) {
        throw invalid(
          'hours',
          `${hoursText(reading.hours)} at ${when(reading.readAt)} is higher than the ${hoursText(after.hours)} read later, at ${when(after.readAt)}.`,
        );
      }
      if (after && after.kind === 'reset' && offset.plus(reading.hours).gt(after.offsetHours)) {
        throw invalid(
          'hours',
          `${hoursText(reading.hours)} at ${when(reading.readAt)} is higher than the ${hoursText(after.offsetHours)} the machine had when its meter was replaced at ${when(after.readAt)}.`,
        );
      }
    }
    return this.readings.insert(
      operationId,
      machineId,
      {
        readAt: reading.readAt,
        hours: reading.hours.toFixed(1),
        kind: reading.kind,
        offsetHours: offset.toFixed(1),
        source: reading.source,
        workEntryId: reading.workEntryId ?? null,
        note: reading.note ?? null,
        createdBy: reading.createdBy,
      },
      tx,
    );
  }
}
