import { Inject, Injectable } from '@nestjs/common';
import type { Page } from '@hitchbook/shared/schemas/common';
import type { InvoiceDto, InvoiceListQuery, InvoiceSendDto, InvoiceSummaryDto } from '@hitchbook/shared/schemas/invoices';
import type { Actor } from '../../common/auth/actor.js';
import { conflict, invalid, notFound } from '../../common/errors/app-error.js';
import { AuditService } from '../../core/audit.service.js';
import { DB, type DbHandle } from '../../core/database.js';
import { invoiceScopeOf } from '../customer-portal/invoice-scope.js';
import { toSummaryDto } from './invoice.dto.js';
import { InvoiceMail } from './invoice-mail.js';
import { renderInvoicePdf } from './invoice-pdf.js';
import { InvoiceViews } from './invoice-views.service.js';
import { InvoicesRepository } from './invoices.repository.js';

export interface InvoiceFile {
  filename: string;
  content: Buffer;
}

/** Reading invoices (scoped: a customer sees only their own issued ones), their PDF, and sending them. */
@Injectable()
export class InvoicesService {
  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(InvoicesRepository) private readonly repo: InvoicesRepository,
    @Inject(InvoiceViews) private readonly views: InvoiceViews,
    @Inject(InvoiceMail) private readonly mail: InvoiceMail,
    @Inject(AuditService) private readonly audit: AuditService,
  ) {}

  async list(actor: Actor, query: InvoiceListQuery): Promise<Page<InvoiceSummaryDto>> {
    const { rows, total } = await this.repo.summaries(invoiceScopeOf(actor), {
      partyId: query.partyId,
      states: query.state,
      kind: query.kind,
      from: query.from,
      to: query.to,
      sort: query.sort,
      limit: query.pageSize,
      offset: (query.page - 1) * query.pageSize,
    });
    return { items: rows.map(toSummaryDto), total, page: query.page, pageSize: query.pageSize };
  }

  get(actor: Actor, id: string): Promise<InvoiceDto> {
    return this.views.detailOrThrow(invoiceScopeOf(actor), id);
  }

  async pdf(actor: Actor, id: string): Promise<InvoiceFile> {
    const invoice = await this.views.detailOrThrow(invoiceScopeOf(actor), id);
    return { filename: `${invoice.numberLabel ?? `draft-${invoice.id.slice(0, 8)}`}.pdf`, content: await renderInvoicePdf(invoice) };
  }

  /** Queues the e-mail with the PDF; the answer never waits for the mail server, which may be down. */
  async send(actor: Actor, id: string, to: string | undefined): Promise<InvoiceSendDto> {
    const operationId = actor.operationId;
    return this.dbh.db.transaction(async (tx) => {
      const invoice = await this.repo.lock(operationId, id, tx);
      if (!invoice) throw notFound('No such invoice.');
      if (invoice.status !== 'issued') throw conflict(invoice.status === 'draft' ? 'Issue the invoice before sending it.' : 'This invoice is void; it is not sent again.');
      const party = await this.repo.party(operationId, invoice.partyId, tx);
      const recipient = to ?? party?.email ?? null;
      if (!recipient) throw invalid('to', `${party?.name ?? 'The party'} has no e-mail address on file; give one.`);
      await this.mail.queueInvoice(operationId, id, recipient, tx);
      await this.repo.update(operationId, id, { sentAt: new Date() }, tx);
      await this.audit.record(this.audit.byActor(actor, 'invoice.sent', 'invoice', id, { after: { to: recipient } }), tx);
      return { queued: true, to: recipient };
    });
  }
}
