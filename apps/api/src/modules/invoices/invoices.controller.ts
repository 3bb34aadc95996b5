import { Body, Controller, Delete, Get, HttpCode, Inject, Param, Patch, Post, Query, StreamableFile } from '@nestjs/common';
import type { Page } from '@hitchbook/shared/schemas/common';
import {
  creditNoteCreateSchema,
  invoiceDraftCreateSchema,
  invoiceDraftUpdateSchema,
  invoiceIssueSchema,
  invoiceListQuerySchema,
  invoiceSendSchema,
  invoiceVoidSchema,
  manualPaymentSchema,
  type CreditNoteCreate,
  type InvoiceDraftCreate,
  type InvoiceDraftUpdate,
  type InvoiceDto,
  type InvoiceListQuery,
  type InvoiceSendDto,
  type InvoiceSummaryDto,
  type ManualPayment,
  type ManualPaymentResultDto,
  type PaymentDto,
} from '@hitchbook/shared/schemas/invoices';
import type { Actor } from '../../common/auth/actor.js';
import { CurrentActor, Roles } from '../../common/auth/decorators.js';
import { UuidPipe } from '../../common/validation/uuid.pipe.js';
import { ZodPipe } from '../../common/validation/zod.pipe.js';
import { IdempotencyKey } from './idempotency.js';
import { InvoiceDraftsService } from './invoice-drafts.service.js';
import { InvoiceIssueService } from './invoice-issue.service.js';
import { InvoicePaymentsService } from './invoice-payments.service.js';
import { InvoicesService } from './invoices.service.js';
import { KeptUntilDataChanges } from '../../common/http/read-cache.js';

/** Owners bill; partners and bookkeepers read; a customer reads only their own issued invoices; operators see no money. */
@Controller('invoices')
export class InvoicesController {
  constructor(
    @Inject(InvoicesService) private readonly invoices: InvoicesService,
    @Inject(InvoiceDraftsService) private readonly drafts: InvoiceDraftsService,
    @Inject(InvoiceIssueService) private readonly issuing: InvoiceIssueService,
    @Inject(InvoicePaymentsService) private readonly payments: InvoicePaymentsService,
  ) {}

  @Roles('owner', 'partner', 'bookkeeper', 'customer')
  @KeptUntilDataChanges()
  @Get()
  list(@CurrentActor() actor: Actor, @Query(new ZodPipe(invoiceListQuerySchema)) query: InvoiceListQuery): Promise<Page<InvoiceSummaryDto>> {
    return this.invoices.list(actor, query);
  }

  @Roles('owner')
  @Post('drafts')
  createDraft(@CurrentActor() actor: Actor, @Body(new ZodPipe(invoiceDraftCreateSchema)) body: InvoiceDraftCreate): Promise<InvoiceDto> {
    return this.drafts.create(actor, body);
  }

  @Roles('owner', 'partner', 'bookkeeper', 'customer')
  @Get(':id')
  get(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string): Promise<InvoiceDto> {
    return this.invoices.get(actor, id);
  }

  @Roles('owner')
  @Patch(':id')
  updateDraft(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string, @Body(new ZodPipe(invoiceDraftUpdateSchema)) body: InvoiceDraftUpdate): Promise<InvoiceDto> {
    return this.drafts.update(actor, id, body);
  }

  @Roles('owner')
  @Delete(':id')
  @HttpCode(204)
  deleteDraft(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string): Promise<void> {
    return this.drafts.remove(actor, id);
  }

  @Roles('owner')
  @Post(':id/issue')
  @HttpCode(200)
  issue(
    @CurrentActor() actor: Actor,
    @Param('id', new UuidPipe()) id: string,
    @Body(new ZodPipe(invoiceIssueSchema)) body: { version?: number },
    @IdempotencyKey() idempotencyKey: string | undefined,
  ): Promise<InvoiceDto> {
    return this.issuing.issue(actor, id, body, idempotencyKey);
  }

  @Roles('owner')
  @Post(':id/void')
  @HttpCode(200)
  void(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string, @Body(new ZodPipe(invoiceVoidSchema)) body: { reason: string }): Promise<InvoiceDto> {
    return this.issuing.void(actor, id, body.reason);
  }

  @Roles('owner')
  @Post(':id/credit-notes')
  creditNote(
    @CurrentActor() actor: Actor,
    @Param('id', new UuidPipe()) id: string,
    @Body(new ZodPipe(creditNoteCreateSchema)) body: CreditNoteCreate,
    @IdempotencyKey() idempotencyKey: string | undefined,
  ): Promise<InvoiceDto> {
    return this.issuing.creditNote(actor, id, body, idempotencyKey);
  }

  @Roles('owner')
  @Post(':id/send')
  @HttpCode(202)
  send(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string, @Body(new ZodPipe(invoiceSendSchema)) body: { to?: string }): Promise<InvoiceSendDto> {
    return this.invoices.send(actor, id, body.to);
  }

  @Roles('owner', 'partner', 'bookkeeper', 'customer')
  @Get(':id/pdf')
  async pdf(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string): Promise<StreamableFile> {
    const file = await this.invoices.pdf(actor, id);
    return new StreamableFile(file.content, { type: 'application/pdf', disposition: `attachment; filename="${file.filename}"`, length: file.content.length });
  }

  @Roles('owner', 'partner', 'bookkeeper', 'customer')
  @Get(':id/payments')
  listPayments(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string): Promise<PaymentDto[]> {
    return this.payments.list(actor, id);
  }

  @Roles('owner')
  @Post(':id/payments')
  recordPayment(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string, @Body(new ZodPipe(manualPaymentSchema)) body: ManualPayment): Promise<ManualPaymentResultDto> {
    return this.payments.recordManual(actor, id, body);
  }
}
