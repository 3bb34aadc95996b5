import { Inject, Injectable } from '@nestjs/common';
import type { Executor, InvoiceLine } from '@hitchbook/db';
import type { InvoiceDto, InvoiceEntryDto } from '@hitchbook/shared/schemas/invoices';
import { notFound } from '../../common/errors/app-error.js';
import { APP_CONFIG, type AppConfig } from '../../core/config.js';
import type { InvoiceScope } from '../customer-portal/invoice-scope.js';
import { snapshotOf, toInvoiceDto } from './invoice.dto.js';
import { InvoicesRepository } from './invoices.repository.js';

export interface KnownParts {
  lines: InvoiceLine[];
  entries?: InvoiceEntryDto[];
}

/** Builds the full invoice as the caller may see it; anything outside the scope does not exist (404). */
@Injectable()
export class InvoiceViews {
  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    @Inject(InvoicesRepository) private readonly repo: InvoicesRepository,
  ) {}

  /**
   * `known`: what a transaction that has just committed the invoice read or wrote of it under its row lock
   * (its lines, its billed entries), which need not be read again: they change only on drafts, under that lock.
   */
  async detailOrThrow(scope: InvoiceScope, id: string, executor?: Executor, known?: KnownParts): Promise<InvoiceDto> {
    const row = await this.repo.summary(scope, id, executor);
    if (!row) throw notFound('No such invoice.');
    const i = row.invoice;
    const lines = known?.lines ?? (await this.repo.lines(scope.operationId, id, executor));
    const entryIds = [...new Set(lines.map((l) => l.workEntryId).filter((e): e is string => e !== null))];
    // One after another: inside a transaction they share one connection.
    const entries = known?.entries ?? (await this.repo.entries(scope.operationId, entryIds, executor));
    const creditNotes = i.kind === 'invoice' ? await this.repo.creditNotesOf(scope.operationId, id, executor) : [];
    const creditOf = i.creditOfInvoiceId ? await this.repo.find(scope.operationId, i.creditOfInvoiceId, executor) : undefined;
    const frozen = i.issuerSnapshot !== null && i.partySnapshot !== null;
    const issuer = frozen ? (i.issuerSnapshot as ReturnType<typeof snapshotOf>) : snapshotOf(await this.repo.operation(scope.operationId, executor));
    const party = frozen ? (i.partySnapshot as ReturnType<typeof snapshotOf>) : snapshotOf((await this.repo.party(scope.operationId, i.partyId, executor))!);
    return toInvoiceDto({ row, lines, entries, creditOf: creditOf ?? null, creditNotes, issuer, party, appUrl: this.config.appUrl });
  }
}
