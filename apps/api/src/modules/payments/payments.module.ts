import { Module } from '@nestjs/common';
import type { AppConfig } from '../../core/config.js';
import { APP_CONFIG } from '../../core/config.js';
import { InvoicesModule } from '../invoices/invoices.module.js';
import { CheckoutService } from './checkout.service.js';
import { CheckoutController, StripeWebhookController } from './payments.controller.js';
import { STRIPE, stripeClientOf } from './stripe-client.js';
import { StripeWebhookService } from './stripe-webhook.service.js';

@Module({
  imports: [InvoicesModule],
  controllers: [CheckoutController, StripeWebhookController],
  providers: [{ provide: STRIPE, inject: [APP_CONFIG], useFactory: (config: AppConfig) => stripeClientOf(config) }, CheckoutService, StripeWebhookService],
})
export class PaymentsModule {}
