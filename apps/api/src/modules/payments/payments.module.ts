import { Module } from '@nestjs/common';
import { InvoicesModule } from '../invoices/invoices.module.js';
import { CheckoutService } from './checkout.service.js';
import { CheckoutController, RefundsController, StripeWebhookController } from './payments.controller.js';
import { StripeModule } from './stripe.module.js';
import { RefundsService } from './refunds.service.js';
import { StripeWebhookService } from './stripe-webhook.service.js';

@Module({
  imports: [InvoicesModule, StripeModule],
  controllers: [CheckoutController, StripeWebhookController, RefundsController],
  providers: [CheckoutService, StripeWebhookService, RefundsService],
})
export class PaymentsModule {}
