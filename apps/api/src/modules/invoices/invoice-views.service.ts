import { Inject, Injectable } from '@nestjs/common';
import type { Executor } from '@hitchbook/db';
import type { InvoiceDto, InvoiceEntryDto } from '@hitchbook/shared/schemas/invoices';
import { notFound } from '../../common/errors/app-error.js';
import { APP_CONFIG, type AppConfig } from '../../core/config.js';
import type { InvoiceScope } from '../customer-portal/invoice-scope.js';
import { billedEntryIds, snapshotOf, toInvoiceDto } from './invoice.dto.js';
import { InvoicesRepository, type ShownLine } from './invoices.repository.js';

/** The lines as the invoice shows them, and the entries they bill when the caller's view lists them. */
export type LinesAndEntries = readonly [ShownLine[], InvoiceEntryDto[] | null];

/** A customer's page lists the entries billed to them; the office's pages show the lines only. */
function listsEntries(scope: InvoiceScope): boolean {
  return scope.partyId !== null;
}

/** Builds the full invoice as the caller may see it; anything outside the scope does not exist (404). */
@Injectable()
export class InvoiceViews {
  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    @Inject(InvoicesRepository) private readonly repo: InvoicesRepository,
  ) {}

  /**
   * `shown`: the lines and entries already being read by `linesAndEntries`, by a caller that holds the invoice's
   * lock while they are read, so they are the ones this answer must show.
   */
  async detailOrThrow(scope: InvoiceScope, id: string, executor?: Executor, shown?: Promise<LinesAndEntries>): Promise<InvoiceDto> {
    const operationId = scope.operationId;
    const [row, [lines, entries], creditNotes] = await this.parts(scope, id, executor, shown);
    if (!row) throw notFound('No such invoice.');
    const i = row.invoice;
    const creditOf = i.creditOfInvoiceId ? await this.repo.find(operationId, i.creditOfInvoiceId, executor) : undefined;
    const frozen = i.issuerSnapshot !== null && i.partySnapshot !== null;
    const issuer = frozen ? (i.issuerSnapshot as ReturnType<typeof snapshotOf>) : snapshotOf(await this.repo.operation(operationId, executor));
    const party = frozen ? (i.partySnapshot as ReturnType<typeof snapshotOf>) : snapshotOf((await this.repo.party(operationId, i.partyId, executor))!);
    return toInvoiceDto({ row, lines, entries, creditOf: creditOf ?? null, creditNotes, issuer, party, appUrl: this.config.appUrl });
  }

  /** The invoice's lines as it shows them, and (for a customer's view) the entries they bill, read on the pool. */
  async linesAndEntries(scope: InvoiceScope, id: string, executor?: Executor): Promise<LinesAndEntries> {
    const lines = await this.repo.shownLines(scope.operationId, id, executor);
    if (!listsEntries(scope)) return [lines, null];
    return [lines, await this.repo.entries(scope.operationId, billedEntryIds(lines), executor)];
  }

  /**
   * Outside a transaction the summary, the lines with their entries, and the credit notes are read at once on
   * the pool's connections; inside one they share its connection and go one after another. What is read
   * alongside the scope check is dropped unseen when the summary says the caller may not see the invoice. A
   * credit note has no credit notes: that read answers none.
   */
  private async parts(scope: InvoiceScope, id: string, executor: Executor | undefined, shown: Promise<LinesAndEntries> | undefined) {
    const { operationId } = scope;
    const summary = () => this.repo.summary(scope, id, executor);
    const linesAndEntries = () => shown ?? this.linesAndEntries(scope, id, executor);
    const creditNotes = () => this.repo.creditNotesOf(operationId, id, executor);
    if (executor) return [await summary(), await linesAndEntries(), await creditNotes()] as const;
    return Promise.all([summary(), linesAndEntries(), creditNotes()]);
  }
}
