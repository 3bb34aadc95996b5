import { Module } from '@nestjs/common';
import { APP_CONFIG, type AppConfig } from '../../core/config.js';
import { STRIPE, stripeClientOf } from './stripe-client.js';

/** The one Stripe client, for opening checkouts and refunds (payments) and for expiring pay links when an invoice is voided (invoices). */
@Module({
  providers: [{ provide: STRIPE, inject: [APP_CONFIG], useFactory: (config: AppConfig) => stripeClientOf(config) }],
  exports: [STRIPE],
})
export class StripeModule {}
