import { invalidRequest, resourceMissing } from './api-error.js';
import { route } from './api-route.js';
import { readExpand } from './expand.js';
import type { Fake } from './fake.js';
import { newId, unixNow } from './ids.js';
import { formatAmount, MAX_AMOUNT } from './money.js';
import type { ChargeRecord, RefundRecord } from './state.js';
import { renderCharge, renderRefund } from './stripe-objects.js';

const REASONS = ['duplicate', 'fraudulent', 'requested_by_customer'] as const;

/** The succeeded charge a refund request points at, through its PaymentIntent or directly. */
function refundableCharge(fake: Fake, target: { paymentIntent?: string; charge?: string }): ChargeRecord {
  if (target.paymentIntent !== undefined) {
    const intent = fake.state.paymentIntents.get(target.paymentIntent);
    if (!intent) throw resourceMissing('payment_intent', target.paymentIntent, 'payment_intent');
    const charge = intent.status === 'succeeded' && intent.latestChargeId ? fake.state.charges.get(intent.latestChargeId) : undefined;
    if (!charge) {
      throw invalidRequest(`This PaymentIntent (${intent.id}) does not have a successful charge to refund; its status is ${intent.status}.`, { param: 'payment_intent' });
    }
    return charge;
  }
  const charge = fake.state.charges.get(target.charge!);
  if (!charge) throw resourceMissing('charge', target.charge!, 'charge');
  if (charge.status !== 'succeeded') throw invalidRequest(`Charge ${charge.id} failed, so there is nothing to refund.`, { param: 'charge' });
  return charge;
}

export const refundRoutes = [
  route({
    method: 'POST',
    path: /^\/v1\/refunds$/,
    parse(p) {
      const paymentIntent = p.string('payment_intent');
      const charge = p.string('charge');
      if (paymentIntent === undefined && charge === undefined) {
        throw invalidRequest('One of the following params should be provided for this request: payment_intent or charge.', { code: 'parameter_missing' });
      }
      if (paymentIntent !== undefined && charge !== undefined) {
        throw invalidRequest('You may only specify one of these parameters: payment_intent, charge.', { code: 'parameters_exclusive', param: 'charge' });
      }
      return {
        paymentIntent,
        charge,
        amount: p.integer('amount', { min: 1, max: MAX_AMOUNT }),
        reason: p.oneOf('reason', REASONS) ?? null,
        metadata: p.metadata(),
        expand: readExpand(p, 'refund'),
      };
    },
    run(fake, input, { request }) {
      const charge = refundableCharge(fake, input);
      const unrefunded = charge.amount - charge.amountRefunded;
      if (unrefunded === 0) throw invalidRequest(`Charge ${charge.id} has already been refunded.`, { code: 'charge_already_refunded' });
      const amount = input.amount ?? unrefunded;
      if (amount > unrefunded) {
        throw invalidRequest(
          `Refund amount (${formatAmount(amount, charge.currency)}) is greater than unrefunded amount on charge (${formatAmount(unrefunded, charge.currency)})`,
          { param: 'amount', code: 'amount_too_large' },
        );
      }
      const refund: RefundRecord = {
        id: newId('re'),
        created: unixNow(),
        amount,
        currency: charge.currency,
        chargeId: charge.id,
        paymentIntentId: charge.paymentIntentId,
        reason: input.reason,
        metadata: input.metadata,
      };
      fake.state.refunds.set(refund.id, refund);
      charge.amountRefunded += amount;
      fake.publish('refund.created', renderRefund(fake.state, refund), request);
      fake.publish('charge.refunded', renderCharge(fake.state, charge), request);
      return renderRefund(fake.state, refund, input.expand);
    },
  }),
  route({
    method: 'GET',
    path: /^\/v1\/refunds\/([^/]+)$/,
    parse: (p) => readExpand(p, 'refund'),
    run(fake, expand, { ids }) {
      const refund = fake.state.refunds.get(ids[0]!);
      if (!refund) throw resourceMissing('refund', ids[0]!, 'refund');
      return renderRefund(fake.state, refund, expand);
    },
  }),
];
