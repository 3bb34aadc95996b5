import { Inject, Injectable } from '@nestjs/common';
import type { Decimal } from 'decimal.js';
import { pgErrorOf, UNIQUE_VIOLATION, type InvoiceLine } from '@hitchbook/db';
import { Dec } from '@hitchbook/shared/decimal';
import { roundToCent, toMoneyString } from '@hitchbook/shared/money';
import type { InvoiceDraftCreate, InvoiceDraftUpdate, InvoiceDto } from '@hitchbook/shared/schemas/invoices';
import type { Actor } from '../../common/auth/actor.js';
import { AppError, conflict, invalid, notFound } from '../../common/errors/app-error.js';
import { AuditService } from '../../core/audit.service.js';
import { DB, type DbHandle } from '../../core/database.js';
import { wholeOperation } from '../customer-portal/invoice-scope.js';
import { RateSheetsRepository } from '../rate-sheets/rate-sheets.repository.js';
import { BillingEntriesRepository } from './billing-entries.repository.js';
import { priceDraft } from './draft-pricing.js';
import { InvoiceViews } from './invoice-views.service.js';
import { InvoicesRepository } from './invoices.repository.js';
import { SERIES } from './invoice-numbers.js';

type StoredDiscount = { kind: 'amount'; amount: string; description: string } | { kind: 'percent'; percent: string; description: string };
type NewLine = Omit<InvoiceLine, 'id' | 'operationId' | 'invoiceId'>;

const OWNER_LINE_KINDS: InvoiceLine['kind'][] = ['adjustment', 'discount'];
const sum = (amounts: string[]): Decimal => amounts.reduce<Decimal>((total, a) => total.plus(a), new Dec(0));

/**
 * Drafts: priced by the engine from approved entries, adjusted by the owner, never numbered. A draft holds
 * the entries it bills: they are invoiced, locked against edits and left out of other drafts until the draft
 * is deleted, so issuing it has nothing to write per entry.
 */
@Injectable()
export class InvoiceDraftsService {
  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(InvoicesRepository) private readonly repo: InvoicesRepository,
    @Inject(BillingEntriesRepository) private readonly entries: BillingEntriesRepository,
    @Inject(RateSheetsRepository) private readonly sheets: RateSheetsRepository,
    @Inject(InvoiceViews) private readonly views: InvoiceViews,
    @Inject(AuditService) private readonly audit: AuditService,
  ) {}

  async create(actor: Actor, input: InvoiceDraftCreate): Promise<InvoiceDto> {
    const operationId = actor.operationId;
    const party = await this.repo.party(operationId, input.partyId);
    if (!party) throw invalid('partyId', 'No such party.');
    if (party.kind !== 'customer') throw invalid('partyId', `${party.name} is a household of the outfit: its work is squared up, not invoiced.`);
    const toBill = await this.entries.unbilled(operationId, party.id, input.from, input.to);
    if (toBill.length === 0) throw invalid('partyId', `No approved, unbilled work entries for ${party.name} from ${input.from} to ${input.to}.`);
    const priced = priceDraft(party, toBill, await this.sheets.liveSheetsFor(operationId, party, input.to), {
      dieselPricePerGallon: input.dieselPricePerGallon,
      travelMilesPerVisit: input.travelMilesPerVisit,
    });
    if (!priced.ok) throw new AppError('validation', 'Some entries cannot be priced.', priced.issues);

    const held = toBill.map((e) => ({ id: e.id, version: e.version }));
    let id: string;
    try {
      id = await this.dbh.db.transaction(async (tx) => {
        const invoice = await this.repo.insert(
          {
            operationId,
            kind: 'invoice',
            series: SERIES.invoice,
            partyId: party.id,
            status: 'draft',
            periodFrom: input.from,
            periodTo: input.to,
            termsDays: priced.termsDays,
            subtotal: priced.subtotal,
            total: priced.subtotal,
            notes: input.notes,
            createdBy: actor.userId,
          },
          tx,
        );
        await this.repo.insertLines(operationId, invoice.id, priced.lines.map((line, i) => ({ ...line, position: i + 1 })), tx);
        // The primary key of invoice_entries refuses an entry another draft took a moment ago, even when
        // two drafts are made at the same moment: the second waits for the first and then fails here.
        await this.entries.claim(operationId, invoice.id, held.map((e) => e.id), tx);
        const moved = await this.entries.markInvoiced(operationId, party.id, held, tx);
        if (moved.length !== held.length) throw conflict('Some of these entries were changed while the draft was being made; make the draft again.');
        await this.audit.record(this.audit.byActor(actor, 'invoice.drafted', 'invoice', invoice.id, { after: { partyId: party.id, from: input.from, to: input.to, subtotal: priced.subtotal, entries: moved } }), tx);
        return invoice.id;
      });
    } catch (err) {
      const pg = pgErrorOf(err);
      if (pg?.code === UNIQUE_VIOLATION && pg.constraint === 'invoice_entries_pkey') {
        throw conflict('Some of these entries went onto another invoice while this draft was being made; make the draft again to bill what is left.');
      }
      throw err;
    }
    return this.views.detailOrThrow(wholeOperation(operationId), id);
  }

  /** Added lines and the discount are the owner's; the priced lines stay as the engine made them. */
  async update(actor: Actor, id: string, input: InvoiceDraftUpdate): Promise<InvoiceDto> {
    const operationId = actor.operationId;
    await this.dbh.db.transaction(async (tx) => {
      const invoice = await this.repo.lock(operationId, id, tx);
      if (!invoice) throw notFound('No such invoice.');
      if (invoice.status !== 'draft') throw conflict('Issued invoices are never edited: void it, or correct it with a credit note.');
      if (invoice.version !== input.version) throw conflict('This draft was changed since you loaded it; reload it and make your change again.');

      const lines = await this.repo.lines(operationId, id, tx);
      const priced = lines.filter((l) => !OWNER_LINE_KINDS.includes(l.kind));
      const existingDiscount = lines.find((l) => l.kind === 'discount');
      let position = Math.max(0, ...priced.map((l) => l.position));
      const added: NewLine[] = input.extraLines
        ? input.extraLines.map((l) => ({
            position: ++position,
            kind: 'adjustment',
            workEntryId: null,
            workDate: null,
            description: l.description,
            fieldName: null,
            workTypeName: null,
            quantity: l.quantity.toFixed(),
            unit: l.unit,
            rate: l.rate.toFixed(),
            amount: toMoneyString(roundToCent(l.quantity.times(l.rate))),
            details: null,
          }))
        : lines.filter((l) => l.kind === 'adjustment').map((l) => ({ ...stripIds(l), position: ++position }));
      const subtotal = sum([...priced, ...added].map((l) => l.amount));

      const discount: StoredDiscount | null =
        input.discount === undefined
          ? ((existingDiscount?.details as { discount?: StoredDiscount } | null)?.discount ?? null)
          : input.discount === null
            ? null
            : input.discount.kind === 'amount'
              ? { kind: 'amount', amount: input.discount.amount.toFixed(), description: input.discount.description }
              : { kind: 'percent', percent: input.discount.percent.toFixed(), description: input.discount.description };
      // A percent discount follows the subtotal, so it is worked out again whenever the lines change.
      const discountAmount = discount ? roundToCent(discount.kind === 'amount' ? new Dec(discount.amount) : subtotal.times(discount.percent).div(100)) : new Dec(0);
      if (discountAmount.gt(subtotal)) throw invalid('discount', `The discount of ${toMoneyString(discountAmount)} is more than the subtotal of ${toMoneyString(subtotal)}.`);
      if (discount) {
        added.push({
          position: ++position,
          kind: 'discount',
          workEntryId: null,
          workDate: null,
          description: discount.description,
          fieldName: null,
          workTypeName: null,
          quantity: null,
          unit: null,
          rate: null,
          amount: toMoneyString(discountAmount.neg()),
          details: { discount },
        });
      }

      await this.repo.deleteLines(operationId, id, OWNER_LINE_KINDS, tx);
      await this.repo.insertLines(operationId, id, added, tx);
      const after = await this.repo.update(
        operationId,
        id,
        {
          subtotal: toMoneyString(subtotal),
          total: toMoneyString(subtotal.minus(discountAmount)),
          ...(input.notes !== undefined ? { notes: input.notes } : {}),
          ...(input.termsDays !== undefined ? { termsDays: input.termsDays } : {}),
          version: invoice.version + 1,
        },
        tx,
      );
      await this.audit.record(
        this.audit.byActor(actor, 'invoice.draft-updated', 'invoice', id, {
          before: { total: invoice.total, notes: invoice.notes, termsDays: invoice.termsDays },
          after: { total: after.total, notes: after.notes, termsDays: after.termsDays, ownerLines: added.map((l) => ({ kind: l.kind, description: l.description, amount: l.amount })) },
        }),
        tx,
      );
    });
    return this.views.detailOrThrow(wholeOperation(operationId), id);
  }

  async remove(actor: Actor, id: string): Promise<void> {
    await this.dbh.db.transaction(async (tx) => {
      const invoice = await this.repo.lock(actor.operationId, id, tx);
      if (!invoice) throw notFound('No such invoice.');
      if (invoice.status !== 'draft') throw conflict('Only drafts can be deleted; void an issued invoice instead.');
      const released = await this.entries.release(actor.operationId, id, tx);
      await this.repo.remove(actor.operationId, id, tx);
      await this.audit.record(this.audit.byActor(actor, 'invoice.draft-deleted', 'invoice', id, { before: { partyId: invoice.partyId, total: invoice.total }, after: { released } }), tx);
    });
  }
}

function stripIds(l: InvoiceLine): NewLine {
  const { id: _id, operationId: _op, invoiceId: _inv, ...rest } = l;
  return rest;
}
