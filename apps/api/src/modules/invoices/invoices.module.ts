import { Module } from '@nestjs/common';
import { StripeModule } from '../payments/stripe.module.js';
import { RateSheetsModule } from '../rate-sheets/rate-sheets.module.js';
import { BillingEntriesRepository } from './billing-entries.repository.js';
import { InvoiceDraftsService } from './invoice-drafts.service.js';
import { InvoiceIssueService } from './invoice-issue.service.js';
import { InvoiceMail } from './invoice-mail.js';
import { InvoicePaymentsService } from './invoice-payments.service.js';
import { InvoiceViews } from './invoice-views.service.js';
import { InvoicesController } from './invoices.controller.js';
import { InvoicesRepository } from './invoices.repository.js';
import { InvoicesService } from './invoices.service.js';

@Module({
  imports: [RateSheetsModule, StripeModule],
  controllers: [InvoicesController],
  providers: [InvoicesRepository, BillingEntriesRepository, InvoiceViews, InvoiceMail, InvoiceDraftsService, InvoiceIssueService, InvoicePaymentsService, InvoicesService],
  exports: [InvoicesRepository, InvoiceViews, InvoicePaymentsService],
})
export class InvoicesModule {}
