import { Inject, Injectable, type StreamableFile } from '@nestjs/common';
import type { Executor, SquareUp, SquareUpTransfer } from '@hitchbook/db';
import { actualMachineRates, squareFamilyWork, statementSums, type PeriodScope } from '@hitchbook/db/square-up-sums';
import type { Page } from '@hitchbook/shared/schemas/common';
import type {
  SquareUpCreate,
  SquareUpDto,
  SquareUpListQuery,
  SquareUpStatementDto,
  SquareUpSummaryDto,
  StatementLinesDto,
  StatementLinesQuery,
  StatementTransferDto,
  TransferDto,
  TransferPaid,
} from '@hitchbook/shared/schemas/square-ups';
import { needsActualRates, squareUpStatementOrThrow } from '@hitchbook/shared/square-up';
import type { Actor } from '../../common/auth/actor.js';
import { conflict, invalid, notFound } from '../../common/errors/app-error.js';
import { AuditService } from '../../core/audit.service.js';
import { DB, type DbHandle } from '../../core/database.js';
import { statementCsv, statementPdf } from './statement-exports.js';
import { StatementRepository } from './statement.repository.js';
import { SquareUpsRepository } from './square-ups.repository.js';

function toDto(row: Pick<SquareUp, 'id' | 'name' | 'periodFrom' | 'periodTo' | 'status' | 'fixedCostsBy' | 'closedAt' | 'createdAt'>): SquareUpDto {
  return {
    id: row.id,
    name: row.name,
    periodFrom: row.periodFrom,
    periodTo: row.periodTo,
    status: row.status,
    fixedCostsBy: row.fixedCostsBy,
    closedAt: row.closedAt ? row.closedAt.toISOString() : null,
    createdAt: row.createdAt.toISOString(),
  };
}

function transferDto(row: SquareUpTransfer, names: ReadonlyMap<string, string>): TransferDto {
  return {
    id: row.id,
    position: row.position,
    fromHouseholdId: row.fromPartyId,
    fromName: names.get(row.fromPartyId) ?? '',
    toHouseholdId: row.toPartyId,
    toName: names.get(row.toPartyId) ?? '',
    amount: row.amount,
    paidOn: row.paidOn,
    method: row.method,
    reference: row.reference,
  };
}

function scopeOf(period: SquareUp): PeriodScope {
  return { operationId: period.operationId, from: period.periodFrom, to: period.periodTo };
}

/** Today as the server's calendar sees it, tolerant by a day of the caller being a time zone ahead. */
function latestAcceptableDay(): string {
  return new Date(Date.now() + 24 * 60 * 60 * 1000).toISOString().slice(0, 10);
}

@Injectable()
export class SquareUpsService {
  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(SquareUpsRepository) private readonly repo: SquareUpsRepository,
    @Inject(StatementRepository) private readonly statements: StatementRepository,
    @Inject(AuditService) private readonly audit: AuditService,
  ) {}

  async create(actor: Actor, input: SquareUpCreate): Promise<SquareUpDto> {
    return this.dbh.db.transaction(async (tx) => {
      await this.repo.lockOperation(actor.operationId, tx);
      const clash = await this.repo.overlapping(actor.operationId, input.periodFrom, input.periodTo, tx);
      if (clash) throw conflict(`The period overlaps "${clash.name}" (${clash.periodFrom} to ${clash.periodTo}); a cost may count in one square-up only.`);
      const row = await this.repo.insert(actor.operationId, { ...input, createdBy: actor.userId }, tx);
      await this.audit.record(this.audit.byActor(actor, 'square-up.created', 'square-up', row.id, { after: toDto(row) }), tx);
      return toDto(row);
    });
  }

  async list(actor: Actor, query: SquareUpListQuery): Promise<Page<SquareUpSummaryDto>> {
    const { rows, total } = await this.repo.list(actor.operationId, { status: query.status, limit: query.pageSize, offset: (query.page - 1) * query.pageSize });
    return {
      items: rows.map((row) => ({ ...toDto(row), transfers: row.transfers, transfersPaid: row.transfersPaid, positiveBalances: row.positiveBalances })),
      total,
      page: query.page,
      pageSize: query.pageSize,
    };
  }

  async get(actor: Actor, id: string): Promise<SquareUpDto> {
    return toDto(await this.periodOrThrow(actor.operationId, id));
  }

  /** The stored statement of a closed period (with the transfers' payments as recorded since), else a fresh one. */
  async statement(actor: Actor, id: string): Promise<SquareUpStatementDto> {
    const period = await this.periodOrThrow(actor.operationId, id);
    if (period.status === 'closed' && period.statement) {
      const stored = period.statement as SquareUpStatementDto;
      const names = new Map(stored.households.map((h) => [h.householdId, h.name]));
      const transfers: StatementTransferDto[] = (await this.repo.transfers(actor.operationId, id)).map((t) => transferDto(t, names));
      return { ...stored, squareUp: toDto(period), frozen: true, transfers };
    }
    return this.compute(period);
  }

  /** The statement as the rows stand now: sums from SQL, split and settled by the engine. */
  async compute(period: SquareUp, executor: Executor = this.dbh.db): Promise<SquareUpStatementDto> {
    const sums = await statementSums(executor, scopeOf(period));
    const actual = needsActualRates(sums) ? await actualMachineRates(executor, period.operationId, Number(period.periodTo.slice(0, 4))) : new Map();
    return squareUpStatementOrThrow(toDto(period), sums, actual, new Date().toISOString());
  }

  /** The rows behind the statement's figures: cost entries (with their improvement slices) or machine use of work entries. */
  async lines(actor: Actor, id: string, query: StatementLinesQuery): Promise<StatementLinesDto> {
    const period = await this.periodOrThrow(actor.operationId, id);
    const scope = scopeOf(period);
    const filter = {
      household: query.household ?? null,
      machine: query.machine ?? null,
      fixedCostsBy: period.fixedCostsBy,
      limit: query.pageSize,
      offset: (query.page - 1) * query.pageSize,
    };
    const page = { page: query.page, pageSize: query.pageSize };
    if (query.kind === 'cost') {
      const { rows, total } = await this.statements.costLines(scope, filter);
      return { kind: 'cost', items: rows, total, ...page };
    }
    const { rows, total } = await this.statements.workLines(scope, filter);
    return { kind: 'work', items: rows, total, ...page };
  }

  /**
   * Freezes the statement, records its transfers and marks the period's family work squared, in one
   * transaction that holds the period's row lock, so no write checked against the period slips between.
   */
  async close(actor: Actor, id: string): Promise<SquareUpStatementDto> {
    return this.dbh.db.transaction(async (tx) => {
      const period = await this.repo.findForUpdate(actor.operationId, id, tx);
      if (!period) throw notFound('No such square-up.');
      if (period.status === 'closed') throw conflict('This square-up is already closed.');
      const fresh = await this.compute(period, tx);
      if (fresh.pendingEntries > 0) {
        throw conflict(`${fresh.pendingEntries} work ${fresh.pendingEntries === 1 ? 'entry' : 'entries'} dated in the period wait for approval; approve or reject them before closing.`);
      }
      const inserted = await this.repo.insertTransfers(
        actor.operationId,
        id,
        fresh.transfers.map((t) => ({ position: t.position, fromPartyId: t.fromHouseholdId, toPartyId: t.toHouseholdId, amount: t.amount })),
        tx,
      );
      const squared = await squareFamilyWork(tx, scopeOf(period));
      const names = new Map(fresh.households.map((h) => [h.householdId, h.name]));
      const closedAt = new Date(fresh.computedAt);
      const frozen: SquareUpStatementDto = {
        ...fresh,
        squareUp: { ...fresh.squareUp, status: 'closed', closedAt: closedAt.toISOString() },
        frozen: true,
        transfers: inserted.map((t) => transferDto(t, names)),
      };
      await this.repo.close(actor.operationId, id, frozen, actor.userId, tx);
      await this.audit.record(
        this.audit.byActor(actor, 'square-up.closed', 'square-up', id, { after: { totals: frozen.totals, transfers: frozen.transfers.length, entriesSquared: squared } }),
        tx,
      );
      return frozen;
    });
  }

  async markTransferPaid(actor: Actor, id: string, transferId: string, paid: TransferPaid): Promise<TransferDto> {
    if (paid.paidOn > latestAcceptableDay()) throw invalid('paidOn', 'A payment cannot be recorded before it is made.');
    return this.dbh.db.transaction(async (tx) => {
      const period = await this.repo.find(actor.operationId, id, tx);
      if (!period) throw notFound('No such square-up.');
      const transfer = await this.repo.findTransferForUpdate(actor.operationId, id, transferId, tx);
      if (!transfer) throw notFound('No such transfer in this square-up.');
      if (transfer.paidOn) throw conflict(`This transfer was already recorded as paid on ${transfer.paidOn}.`);
      const after = await this.repo.markTransferPaid(actor.operationId, transferId, paid, actor.userId, tx);
      await this.audit.record(this.audit.byActor(actor, 'square-up.transfer-paid', 'square-up-transfer', transferId, { before: transfer, after }), tx);
      const stored = period.statement as SquareUpStatementDto | null;
      return transferDto(after, new Map(stored?.households.map((h) => [h.householdId, h.name]) ?? []));
    });
  }

  async statementCsv(actor: Actor, id: string): Promise<StreamableFile> {
    return statementCsv(await this.statement(actor, id));
  }

  async statementPdf(actor: Actor, id: string): Promise<StreamableFile> {
    return statementPdf(await this.statement(actor, id), actor.operationName);
  }

  /** The current open period's figure for the dashboard: what the households owe one another so far. */
  async openBalance(operationId: string, today: string): Promise<{ squareUp: SquareUpDto; positiveBalances: string } | null> {
    const period = await this.repo.currentOpen(operationId, today);
    if (!period) return null;
    const statement = await this.compute(period);
    return { squareUp: statement.squareUp, positiveBalances: statement.totals.positiveBalances };
  }

  private async periodOrThrow(operationId: string, id: string): Promise<SquareUp> {
    const period = await this.repo.find(operationId, id);
    if (!period) throw notFound('No such square-up.');
    return period;
  }
}
