import type { Fake } from './fake.js';
import type { Params } from './params.js';
import type { EventRequest } from './state.js';
import type { StripeJson } from './stripe-objects.js';

/** What an endpoint learns about the call besides its parameters. */
export interface ApiCall {
  /** The ids captured from the path, e.g. the session id of /v1/checkout/sessions/:id. */
  ids: string[];
  request: EventRequest;
}

/**
 * One /v1 endpoint in two steps, as Stripe runs them: `parse` validates the parameters and changes nothing
 * (its errors are never saved under an idempotency key), then `run` does the work and may change state
 * (its answer, success or error, is what a repeated idempotency key replays).
 */
export interface ApiRoute<Input> {
  method: 'GET' | 'POST';
  path: RegExp;
  parse(params: Params): Input;
  run(fake: Fake, input: Input, call: ApiCall): StripeJson;
}

/** Erases the input type so routes of different inputs fit in one list. */
export function route<Input>(definition: ApiRoute<Input>): ApiRoute<unknown> {
  return definition as ApiRoute<unknown>;
}
