import { Inject, Injectable } from '@nestjs/common';
import type { Decimal } from 'decimal.js';
import { sql } from 'drizzle-orm';
import type Stripe from 'stripe';
import type { Executor, Invoice } from '@hitchbook/db';
import { Dec } from '@hitchbook/shared/decimal';
import { toMoneyString } from '@hitchbook/shared/money';
import type { CreditNoteCreate, InvoiceDto } from '@hitchbook/shared/schemas/invoices';
import type { Actor } from '../../common/auth/actor.js';
import { conflict, invalid, notFound } from '../../common/errors/app-error.js';
import { AuditService } from '../../core/audit.service.js';
import { DB, type DbHandle } from '../../core/database.js';
import { killPointAfterCommit } from '../../core/fault-points.js';
import { wholeOperation } from '../customer-portal/invoice-scope.js';
import { expireOpenSessions } from '../payments/open-sessions.js';
import { STRIPE } from '../payments/stripe-client.js';
import { BillingEntriesRepository } from './billing-entries.repository.js';
import { claimIdempotencyKey, saveIdempotentResult } from './idempotency.js';
import { snapshotOf } from './invoice.dto.js';
import { numberLabel, SERIES, takeNextNumber } from './invoice-numbers.js';
import { InvoiceViews, type LinesAndEntries } from './invoice-views.service.js';
import { InvoicesRepository } from './invoices.repository.js';

interface Saved {
  invoiceId: string;
  /** False when an earlier request with the same Idempotency-Key did the work. */
  fresh?: boolean;
}

/**
 * Issuing, voiding and crediting: each in one transaction, so a failure anywhere leaves no number taken
 * and no line changed. Issued documents are never edited afterwards.
 */
@Injectable()
export class InvoiceIssueService {
  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(InvoicesRepository) private readonly repo: InvoicesRepository,
    @Inject(BillingEntriesRepository) private readonly entries: BillingEntriesRepository,
    @Inject(InvoiceViews) private readonly views: InvoiceViews,
    @Inject(AuditService) private readonly audit: AuditService,
    @Inject(STRIPE) private readonly stripe: Stripe | null,
  ) {}

  async issue(actor: Actor, id: string, body: { version?: number }, idempotencyKey?: string): Promise<InvoiceDto> {
    const operationId = actor.operationId;
    const remembered = idempotencyKey ? { operationId, key: idempotencyKey, route: 'POST /api/invoices/:id/issue', request: { id, version: body.version ?? null } } : null;
    let shown: Promise<LinesAndEntries> | undefined;
    const saved = await this.dbh.db.transaction(async (tx): Promise<Saved> => {
      if (remembered) {
        const earlier = await claimIdempotencyKey<Saved>(tx, remembered);
        if (earlier) return earlier;
      }
      const invoice = await this.repo.lock(operationId, id, tx);
      if (!invoice) throw notFound('No such invoice.');
      if (invoice.status !== 'draft') {
        throw conflict(invoice.status === 'void' ? 'This invoice is void.' : `This invoice was already issued as ${numberLabel(invoice.series, invoice.number)}.`);
      }
      if (body.version !== undefined && body.version !== invoice.version) throw conflict('This draft was changed since you loaded it; reload it before issuing.');
      // Read for the answer on another connection while this transaction goes on: under the invoice's lock its
      // lines cannot change, its entries are held and cannot either, and issuing changes neither.
      shown = this.views.linesAndEntries(wholeOperation(operationId), id);
      shown.catch(() => undefined);

      const counts = await this.repo.draftCounts(operationId, id, tx);
      if (counts.lines === 0) throw conflict('This draft has no lines; add work or a line before issuing it.');
      // The draft holds its entries since it was made, and they cannot change while it does: nothing to
      // write per entry here, only a check that none slipped out of its hold (it holds no entry it does not bill).
      if (counts.held !== counts.billed) {
        const unheld = await this.entries.unheldLines(operationId, id, tx);
        const named = unheld.map((l) => `${l.workDate ?? ''} ${l.fieldName ?? ''}`.trim()).join('; ');
        throw conflict(`This draft no longer holds some of its entries: ${named}. Delete this draft and make a new one.`);
      }
      const party = (await this.repo.party(operationId, invoice.partyId, tx))!;
      const issuer = await this.repo.operation(operationId, tx);
      const number = await takeNextNumber(tx, operationId, invoice.series);
      await this.repo.update(
        operationId,
        id,
        {
          status: 'issued',
          number,
          issueDate: sql`current_date`,
          dueDate: sql`current_date + ${invoice.termsDays}::int`,
          issuerSnapshot: snapshotOf(issuer),
          partySnapshot: snapshotOf(party),
          issuedAt: new Date(),
          issuedBy: actor.userId,
          version: invoice.version + 1,
        },
        tx,
      );
      await this.audit.record(this.audit.byActor(actor, 'invoice.issued', 'invoice', id, { after: { number: numberLabel(invoice.series, number), total: invoice.total, entries: counts.billed } }), tx);
      if (remembered) await saveIdempotentResult(tx, remembered, { invoiceId: id });
      return { invoiceId: id, fresh: true };
    });
    if (saved.fresh) killPointAfterCommit('invoice-issue');
    return this.views.detailOrThrow(wholeOperation(operationId), saved.invoiceId, undefined, saved.fresh ? shown : undefined);
  }

  /** A void invoice keeps its number; its entries are approved and billable again, and its open pay links are expired. */
  async void(actor: Actor, id: string, reason: string): Promise<InvoiceDto> {
    const operationId = actor.operationId;
    await this.dbh.db.transaction(async (tx) => {
      const invoice = await this.repo.lock(operationId, id, tx);
      if (!invoice) throw notFound('No such invoice.');
      if (invoice.status === 'draft') throw conflict('A draft is not issued; delete it instead.');
      if (invoice.status === 'void') throw conflict('This invoice is already void.');
      if (new Dec(invoice.amountPaid).gt(0)) throw conflict('Payments are recorded on this invoice; correct it with a credit note instead.');
      if ((await this.repo.creditNotesOf(operationId, id, tx)).some((cn) => cn.status === 'issued')) {
        throw conflict('Credit notes refer to this invoice; correct it with a further credit note instead.');
      }
      // Last, after every refusal above: a pay link is only cancelled for a void that goes through.
      const expiredSessions = await expireOpenSessions(this.stripe, tx, operationId, id);
      const released = await this.entries.release(operationId, id, tx);
      await this.repo.update(operationId, id, { status: 'void', voidedAt: new Date(), voidReason: reason, version: invoice.version + 1 }, tx);
      await this.audit.record(this.audit.byActor(actor, 'invoice.voided', 'invoice', id, { before: { status: invoice.status }, after: { status: 'void', reason, released, expiredSessions } }), tx);
    });
    return this.views.detailOrThrow(wholeOperation(operationId), id);
  }

  /**
   * A credit note is its own numbered document (series CN) that refers to the original. Its lines and
   * total are negative, so an invoice and a credit note for all of it add up to zero; the original's
   * balance goes down by the amount credited.
   */
  async creditNote(actor: Actor, id: string, input: CreditNoteCreate, idempotencyKey?: string): Promise<InvoiceDto> {
    const operationId = actor.operationId;
    const remembered = idempotencyKey
      ? { operationId, key: idempotencyKey, route: 'POST /api/invoices/:id/credit-notes', request: { id, reason: input.reason, lines: input.lines?.map((l) => [l.description, l.amount.toFixed()]) ?? null } }
      : null;
    const saved = await this.dbh.db.transaction(async (tx): Promise<Saved> => {
      if (remembered) {
        const earlier = await claimIdempotencyKey<Saved>(tx, remembered);
        if (earlier) return earlier;
      }
      const original = await this.repo.lock(operationId, id, tx);
      if (!original) throw notFound('No such invoice.');
      if (original.kind !== 'invoice' || original.status !== 'issued') throw conflict('Only an issued invoice can be credited.');
      const credited = (await this.repo.creditNotesOf(operationId, id, tx)).filter((cn) => cn.status === 'issued').reduce((s, cn) => s.minus(cn.total), new Dec(0));
      const lines = input.lines ? creditLines(input.lines) : await this.reversedLines(original, credited, tx);
      const total = lines.reduce((s, l) => s.plus(l.amount), new Dec(0));
      const left = new Dec(original.total).minus(credited);
      if (total.neg().gt(left)) {
        throw invalid('lines', `This credits ${toMoneyString(total.neg())}, but only ${toMoneyString(left)} of ${numberLabel(original.series, original.number)} is left to credit.`);
      }
      // The balance drops: a pay link opened for the old one would take too much.
      await expireOpenSessions(this.stripe, tx, operationId, id, { bestEffort: true });
      const party = (await this.repo.party(operationId, original.partyId, tx))!;
      const issuer = await this.repo.operation(operationId, tx);
      const number = await takeNextNumber(tx, operationId, SERIES['credit-note']);
      const note = await this.repo.insert(
        {
          operationId,
          kind: 'credit-note',
          series: SERIES['credit-note'],
          number,
          partyId: original.partyId,
          status: 'issued',
          periodFrom: original.periodFrom,
          periodTo: original.periodTo,
          issueDate: sql`current_date`,
          termsDays: 0,
          subtotal: toMoneyString(total),
          total: toMoneyString(total),
          notes: input.reason,
          creditOfInvoiceId: original.id,
          issuerSnapshot: snapshotOf(issuer),
          partySnapshot: snapshotOf(party),
          issuedAt: new Date(),
          issuedBy: actor.userId,
          createdBy: actor.userId,
        },
        tx,
      );
      await this.repo.insertLines(operationId, note.id, lines.map((l, i) => ({ ...l, amount: toMoneyString(l.amount), position: i + 1 })), tx);
      await this.audit.record(
        this.audit.byActor(actor, 'credit-note.issued', 'invoice', note.id, {
          after: { number: numberLabel(SERIES['credit-note'], number), creditOf: numberLabel(original.series, original.number), total: toMoneyString(total), reason: input.reason },
        }),
        tx,
      );
      if (remembered) await saveIdempotentResult(tx, remembered, { invoiceId: note.id });
      return { invoiceId: note.id };
    });
    return this.views.detailOrThrow(wholeOperation(operationId), saved.invoiceId);
  }

  /** Without lines, the credit note reverses the original line by line, which only makes sense once. */
  private async reversedLines(original: Invoice, credited: Decimal, tx: Executor) {
    if (credited.gt(0)) throw conflict('Part of this invoice was credited already; give the lines to credit.');
    return (await this.repo.lines(original.operationId, original.id, tx)).map((l) => ({
      kind: l.kind,
      workEntryId: l.workEntryId,
      workDate: l.workDate,
      description: l.description,
      fieldName: l.fieldName,
      workTypeName: l.workTypeName,
      quantity: l.quantity,
      unit: l.unit,
      rate: l.rate,
      amount: new Dec(l.amount).neg(),
      details: { reverses: l.id },
    }));
  }
}

function creditLines(lines: NonNullable<CreditNoteCreate['lines']>) {
  return lines.map((l) => ({
    kind: 'adjustment' as const,
    workEntryId: null,
    workDate: null,
    description: l.description,
    fieldName: null,
    workTypeName: null,
    quantity: null,
    unit: null,
    rate: null,
    amount: l.amount.neg(),
    details: null,
  }));
}
