/** The `error` member of Stripe's error responses; absent fields are left out, as Stripe does. */
export interface StripeErrorBody {
  type: 'invalid_request_error' | 'card_error' | 'idempotency_error' | 'api_error';
  message: string;
  code?: string;
  decline_code?: string;
  param?: string;
  doc_url?: string;
  charge?: string;
  payment_intent?: unknown;
}

/** Thrown by endpoints; the HTTP layer turns it into `{ error: body }` with `status`. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly body: StripeErrorBody,
  ) {
    super(body.message);
  }
}

export function errorBody(type: StripeErrorBody['type'], message: string, extra: Omit<Partial<StripeErrorBody>, 'type' | 'message'> = {}): StripeErrorBody {
  const body: StripeErrorBody = { type, message, ...extra };
  if (body.code) body.doc_url = `https://stripe.com/docs/error-codes/${body.code.replace(/_/g, '-')}`;
  return body;
}

export function invalidRequest(message: string, { param, code, status = 400 }: { param?: string; code?: string; status?: number } = {}): ApiError {
  return new ApiError(status, errorBody('invalid_request_error', message, definedOnly({ param, code })));
}

/** Stripe's 404 for an id it does not know, e.g. "No such payment_intent: 'pi_123'". */
export function resourceMissing(objectName: string, id: string, param = 'id'): ApiError {
  return invalidRequest(`No such ${objectName}: '${id}'`, { param, code: 'resource_missing', status: 404 });
}

export function definedOnly<T extends Record<string, unknown>>(value: T): Partial<T> {
  return Object.fromEntries(Object.entries(value).filter(([, v]) => v !== undefined)) as Partial<T>;
}
