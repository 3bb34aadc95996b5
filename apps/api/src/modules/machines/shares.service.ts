import { Inject, Injectable } from '@nestjs/common';
import type { Decimal } from 'decimal.js';
import type { Executor } from '@hitchbook/db';
import { Dec } from '@hitchbook/shared/decimal';
import { FULL_OWNERSHIP_PCT, type MachineSharesDto, type MachineSharesPut, type ShareSetDto } from '@hitchbook/shared/schemas/machines';
import type { Actor } from '../../common/auth/actor.js';
import { AppError } from '../../common/errors/app-error.js';
import { AuditService } from '../../core/audit.service.js';
import { DB, type DbHandle } from '../../core/database.js';
import { PartiesRepository } from '../parties/parties.repository.js';
import { todayIso } from './calendar.js';
import { MachineAccess } from './machine-access.js';
import { toOwnerDto } from './machine-dto.js';
import { MachinesRepository } from './machines.repository.js';
import { SharesRepository, type ShareRow } from './shares.repository.js';

function groupSets(rows: readonly ShareRow[]): ShareSetDto[] {
  const sets: ShareSetDto[] = [];
  for (const row of rows) {
    const last = sets.at(-1);
    if (last?.effectiveFrom === row.effectiveFrom) last.shares.push(toOwnerDto(row));
    else sets.push({ effectiveFrom: row.effectiveFrom, shares: [toOwnerDto(row)] });
  }
  return sets;
}

@Injectable()
export class SharesService {
  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(SharesRepository) private readonly shares: SharesRepository,
    @Inject(MachinesRepository) private readonly machines: MachinesRepository,
    @Inject(PartiesRepository) private readonly parties: PartiesRepository,
    @Inject(MachineAccess) private readonly access: MachineAccess,
    @Inject(AuditService) private readonly audit: AuditService,
  ) {}

  async get(actor: Actor, machineId: string, on: string = todayIso()): Promise<MachineSharesDto> {
    await this.access.machineOrThrow(actor, 'machine.read', machineId);
    const history = groupSets(await this.shares.history(actor.operationId, machineId));
    return { on, current: history.find((set) => set.effectiveFrom <= on) ?? null, history };
  }

  async put(actor: Actor, machineId: string, input: MachineSharesPut): Promise<MachineSharesDto> {
    await this.dbh.db.transaction(async (tx) => {
      await this.access.machineOrThrow(actor, 'machine.change', machineId, tx);
      const before = await this.shares.history(actor.operationId, machineId, tx);
      await this.writeSetOrThrow(tx, actor, machineId, input.effectiveFrom, input.shares, 'shares');
      await this.audit.record(
        this.audit.byActor(actor, 'machine.shares-set', 'machine', machineId, { before: groupSets(before), after: { effectiveFrom: input.effectiveFrom, shares: input.shares } }),
        tx,
      );
    });
    return this.get(actor, machineId, input.effectiveFrom > todayIso() ? input.effectiveFrom : todayIso());
  }

  /**
   * Writes one share set inside the caller's transaction: the machine is locked, every owner must be a
   * household of the operation, and the stored set is added up again before the transaction may commit,
   * so no set that misses 100 % is ever visible to anyone.
   */
  async writeSetOrThrow(tx: Executor, actor: Actor, machineId: string, effectiveFrom: string, lines: readonly { partyId: string; sharePct: Decimal }[], path: string): Promise<void> {
    await this.machines.lock(actor.operationId, machineId, tx);
    const issues: { path: string; message: string }[] = [];
    for (const [index, line] of lines.entries()) {
      const party = await this.parties.find(actor.operationId, line.partyId, tx);
      if (!party) issues.push({ path: `${path}.${index}.partyId`, message: 'No such party.' });
      else if (party.kind !== 'household') issues.push({ path: `${path}.${index}.partyId`, message: `${party.name} is a customer; only households own machines.` });
      else if (party.archivedAt) issues.push({ path: `${path}.${index}.partyId`, message: `${party.name} is archived.` });
    }
    if (issues.length > 0) throw new AppError('validation', 'Some owners cannot hold a share.', issues);
    await this.shares.replaceSet(actor.operationId, machineId, effectiveFrom, lines.map((l) => ({ partyId: l.partyId, sharePct: l.sharePct.toFixed() })), actor.userId, tx);
    const stored = new Dec(await this.shares.setTotal(actor.operationId, machineId, effectiveFrom, tx));
    if (!stored.eq(FULL_OWNERSHIP_PCT)) {
      throw new AppError('validation', 'Some fields need attention.', [
        { path, message: `Shares must add up to exactly 100 %; these add up to ${stored.toString()} %` },
      ]);
    }
  }
}
