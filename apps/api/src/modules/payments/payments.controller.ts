import { Body, Controller, Headers, HttpCode, Inject, Param, Post, Req, type RawBodyRequest } from '@nestjs/common';
import type { Request } from 'express';
import { invoiceCheckoutSchema, paymentRefundSchema, type CheckoutDto, type ManualPaymentResultDto, type PaymentRefundInput } from '@hitchbook/shared/schemas/invoices';
import type { Actor } from '../../common/auth/actor.js';
import { CurrentActor, Public, Roles } from '../../common/auth/decorators.js';
import { UuidPipe } from '../../common/validation/uuid.pipe.js';
import { ZodPipe } from '../../common/validation/zod.pipe.js';
import { IdempotencyKey } from '../invoices/idempotency.js';
import { CheckoutService } from './checkout.service.js';
import { RefundsService } from './refunds.service.js';
import { StripeWebhookService } from './stripe-webhook.service.js';

@Controller('invoices')
export class CheckoutController {
  constructor(@Inject(CheckoutService) private readonly checkout: CheckoutService) {}

  /** The invoice's own customer pays it; the owner may open the same page for them. The body takes no amount. */
  @Roles('owner', 'customer')
  @Post(':id/checkout')
  @HttpCode(200)
  open(@CurrentActor() actor: Actor, @Param('id', new UuidPipe()) id: string, @Body(new ZodPipe(invoiceCheckoutSchema)) _body: Record<string, never>): Promise<CheckoutDto> {
    return this.checkout.open(actor, id);
  }
}

@Controller('payments')
export class StripeWebhookController {
  constructor(@Inject(StripeWebhookService) private readonly webhooks: StripeWebhookService) {}

  /** Anonymous by design: Stripe signs the body, and the signature is the only proof that counts. */
  @Public()
  @Post('stripe-webhook')
  @HttpCode(200)
  receive(@Req() req: RawBodyRequest<Request>, @Headers('stripe-signature') signature: string | undefined): Promise<{ received: true }> {
    return this.webhooks.receive(req.rawBody, signature);
  }
}

@Controller('invoices')
export class RefundsController {
  constructor(@Inject(RefundsService) private readonly refunds: RefundsService) {}

  /** Only the owner hands money back, as only the owner records it. */
  @Roles('owner')
  @Post(':id/payments/:paymentId/refund')
  @HttpCode(200)
  refund(
    @CurrentActor() actor: Actor,
    @Param('id', new UuidPipe()) id: string,
    @Param('paymentId', new UuidPipe()) paymentId: string,
    @Body(new ZodPipe(paymentRefundSchema)) body: PaymentRefundInput,
    @IdempotencyKey() idempotencyKey: string | undefined,
  ): Promise<ManualPaymentResultDto> {
    return this.refunds.refund(actor, id, paymentId, body, idempotencyKey);
  }
}
