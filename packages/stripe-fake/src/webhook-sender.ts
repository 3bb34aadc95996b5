import { unixNow } from './ids.js';
import { signatureHeader } from './webhook-signature.js';

/** Where events go and the secret they are signed with (whsec_…), which the endpoint verifies them by. */
export interface WebhookEndpoint {
  url: string;
  secret: string;
}

/** One POST of one event to the endpoint, as the control API lists it. */
export interface DeliveryAttempt {
  event_id: string;
  event_type: string;
  attempt: number;
  url: string;
  sent_at: string;
  /** The endpoint's HTTP status, or null when it did not answer (refused, timed out). */
  status: number | null;
  error: string | null;
  /** The start of what the endpoint answered, to show why it refused. */
  response_body: string | null;
  delivered: boolean;
  duration_ms: number;
}

/** `held`: waiting for `release`; `failed`: every attempt of the schedule was refused; `no_endpoint`: nowhere to send it. */
export type DeliveryStatus = 'pending' | 'held' | 'delivered' | 'failed' | 'no_endpoint';

export interface OutgoingEvent {
  id: string;
  type: string;
  /** The exact bytes signed and sent; a resend sends them again. */
  payload: string;
}

const RESPONSE_BODY_KEPT = 500;

/**
 * Posts signed events to the one configured endpoint. Anything but a 2xx answer (a redirect, an error,
 * no answer within the timeout) is a failure, retried after each delay of `retrySchedule` in turn, every
 * attempt signed afresh with the current time, as Stripe does.
 */
export class WebhookSender {
  private readonly log: DeliveryAttempt[] = [];
  private readonly statuses = new Map<string, DeliveryStatus>();
  private held: OutgoingEvent[] | null = null;
  private readonly timers = new Set<NodeJS.Timeout>();
  private readonly requests = new Set<AbortController>();
  /** Bumped by `reset`, so deliveries begun before it neither log nor retry. */
  private generation = 0;

  constructor(
    private endpoint: WebhookEndpoint | null,
    private readonly retrySchedule: readonly number[],
    private readonly timeoutMs: number,
  ) {}

  get currentEndpoint(): WebhookEndpoint | null {
    return this.endpoint;
  }

  setEndpoint(endpoint: WebhookEndpoint | null): void {
    this.endpoint = endpoint;
  }

  get isHeld(): boolean {
    return this.held !== null;
  }

  send(event: OutgoingEvent): void {
    if (this.held) {
      this.held.push(event);
      this.statuses.set(event.id, 'held');
      return;
    }
    void this.deliver(event, 1, this.generation);
  }

  /** From now on events wait, so a test can release them in another order. */
  hold(): void {
    this.held ??= [];
  }

  /**
   * Sends the held events one after another, each waiting for its first attempt's answer, so they arrive in
   * exactly this order: the ids in `order` first, then the rest as they happened. Later events go out at once again.
   */
  async release(order: readonly string[] = []): Promise<string[]> {
    const held = this.held ?? [];
    const unknown = order.filter((id) => !held.some((e) => e.id === id));
    if (unknown.length > 0) throw new Error(`not held: ${unknown.join(', ')}`);
    this.held = null;
    const sequence = [...order.map((id) => held.find((e) => e.id === id)!), ...held.filter((e) => !order.includes(e.id))];
    const generation = this.generation;
    for (const event of sequence) await this.deliver(event, 1, generation);
    return sequence.map((e) => e.id);
  }

  statusOf(eventId: string): DeliveryStatus | undefined {
    return this.statuses.get(eventId);
  }

  attempts(): DeliveryAttempt[] {
    return this.log.map((a) => ({ ...a }));
  }

  /** Forgets every attempt and stops every delivery and retry under way. */
  reset(): void {
    this.generation += 1;
    for (const timer of this.timers) clearTimeout(timer);
    this.timers.clear();
    for (const request of this.requests) request.abort();
    this.requests.clear();
    this.log.length = 0;
    this.statuses.clear();
    this.held = null;
  }

  private async deliver(event: OutgoingEvent, attempt: number, generation: number): Promise<void> {
    const endpoint = this.endpoint;
    if (!endpoint) {
      this.statuses.set(event.id, 'no_endpoint');
      return;
    }
    this.statuses.set(event.id, 'pending');
    const sentAt = new Date();
    const answer = await this.post(endpoint, event.payload);
    if (generation !== this.generation) return;
    const delivered = answer.status !== null && answer.status >= 200 && answer.status < 300;
    this.log.push({
      event_id: event.id,
      event_type: event.type,
      attempt,
      url: endpoint.url,
      sent_at: sentAt.toISOString(),
      status: answer.status,
      error: answer.error,
      response_body: answer.body,
      delivered,
      duration_ms: Date.now() - sentAt.getTime(),
    });
    if (delivered) {
      this.statuses.set(event.id, 'delivered');
      return;
    }
    const delay = this.retrySchedule[attempt - 1];
    if (delay === undefined) {
      this.statuses.set(event.id, 'failed');
      return;
    }
    const timer = setTimeout(() => {
      this.timers.delete(timer);
      void this.deliver(event, attempt + 1, generation);
    }, delay);
    this.timers.add(timer);
  }

  private async post(endpoint: WebhookEndpoint, payload: string): Promise<{ status: number | null; error: string | null; body: string | null }> {
    const controller = new AbortController();
    this.requests.add(controller);
    const timer = setTimeout(() => controller.abort(new Error(`no answer within ${this.timeoutMs} ms`)), this.timeoutMs);
    try {
      const res = await fetch(endpoint.url, {
        method: 'POST',
        headers: {
          'content-type': 'application/json; charset=utf-8',
          'stripe-signature': signatureHeader(payload, endpoint.secret, unixNow()),
          'user-agent': 'Stripe/1.0 (+https://stripe.com/docs/webhooks)',
        },
        body: payload,
        // Stripe does not follow redirects from a webhook endpoint; a 3xx counts as a failed attempt.
        redirect: 'manual',
        signal: controller.signal,
      });
      const body = (await res.text()).slice(0, RESPONSE_BODY_KEPT);
      return { status: res.status, error: null, body };
    } catch (error) {
      return { status: null, error: describeFailure(error), body: null };
    } finally {
      clearTimeout(timer);
      this.requests.delete(controller);
    }
  }
}

function describeFailure(error: unknown): string {
  const cause = (error as { cause?: { code?: string; message?: string } }).cause;
  if (cause?.code) return cause.code;
  if (cause?.message) return cause.message;
  return error instanceof Error ? error.message : String(error);
}
