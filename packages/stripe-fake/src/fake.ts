import { IdempotencyStore } from './idempotency.js';
import { newId, unixNow } from './ids.js';
import { FakeState, type EventRecord, type EventRequest } from './state.js';
import { renderEvent, type StripeJson } from './stripe-objects.js';
import type { WebhookSender } from './webhook-sender.js';

/** The version stripe-node 23.1.0 pins; events name it, as Stripe names the account's API version. */
export const DEFAULT_API_VERSION = '2026-10-28.endive';

/** The fake's memory plus what every endpoint needs: where the checkout pages live and how events go out. */
export class Fake {
  readonly state = new FakeState();
  readonly idempotency = new IdempotencyStore();
  /** Where browsers reach the fake; known once the server listens. */
  baseUrl = '';

  constructor(
    readonly webhooks: WebhookSender,
    /** The secret the fake was started with; an endpoint set later without its own secret signs with it. */
    readonly webhookSecret: string,
    readonly apiVersion = DEFAULT_API_VERSION,
  ) {}

  checkoutUrl(sessionId: string): string {
    return `${this.baseUrl}/checkout/${sessionId}`;
  }

  /** Records an event with a snapshot of `object` as it is now and hands it to the webhook sender. */
  publish(type: string, object: StripeJson, request: EventRequest): EventRecord {
    const event: EventRecord = { id: newId('evt'), type, created: unixNow(), apiVersion: this.apiVersion, object: structuredClone(object), request };
    this.state.events.set(event.id, event);
    this.webhooks.send({ id: event.id, type, payload: this.payloadOf(event) });
    return event;
  }

  /** Sends an event again with the same id and body, the way an endpoint sees a duplicate delivery. */
  resend(event: EventRecord): void {
    this.webhooks.send({ id: event.id, type: event.type, payload: this.payloadOf(event) });
  }

  renderEvent(event: EventRecord): StripeJson {
    const status = this.webhooks.statusOf(event.id);
    return renderEvent(event, status === 'pending' || status === 'held' ? 1 : 0);
  }

  reset(): void {
    this.state.clear();
    this.idempotency.clear();
    this.webhooks.reset();
  }

  /** Pretty-printed like Stripe's own webhook bodies, so an endpoint that re-serialises the JSON fails verification here too. */
  private payloadOf(event: EventRecord): string {
    return JSON.stringify(renderEvent(event, this.webhooks.currentEndpoint ? 1 : 0), null, 2);
  }
}
