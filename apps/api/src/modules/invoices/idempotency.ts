import { createHash } from 'node:crypto';
import { createParamDecorator, type ExecutionContext } from '@nestjs/common';
import { and, eq } from 'drizzle-orm';
import { idempotencyKeys, type Executor } from '@hitchbook/db';
import { idempotencyKeySchema } from '@hitchbook/shared/schemas/invoices';
import { AppError, invalid } from '../../common/errors/app-error.js';

/** The optional Idempotency-Key header: absent is fine, malformed is a 400 naming the header. */
export function idempotencyKeyOf(value: unknown): string | undefined {
  if (value === undefined) return undefined;
  const parsed = idempotencyKeySchema.safeParse(value);
  if (!parsed.success) throw new AppError('validation', 'Some fields need attention.', [{ path: 'Idempotency-Key', message: parsed.error.issues[0]!.message }]);
  return parsed.data;
}

export const IdempotencyKey = createParamDecorator((_data: unknown, ctx: ExecutionContext): string | undefined =>
  idempotencyKeyOf(ctx.switchToHttp().getRequest<{ headers: Record<string, unknown> }>().headers['idempotency-key']),
);

export interface RememberedRequest {
  operationId: string;
  key: string;
  route: string;
  /** The request's meaning: a key reused for a different request is refused, not replayed. */
  request: unknown;
}

const hashOf = (request: unknown) => createHash('sha256').update(JSON.stringify(request)).digest('hex');

/**
 * Claims the key inside the transaction that does the work. A concurrent request with the same key
 * waits on the unique index until this one ends; if it committed, the saved result is handed back,
 * and if it rolled back the key is free again, so only successes are ever replayed.
 * Answers the saved result of an earlier success, or null when this request is the first.
 */
export async function claimIdempotencyKey<T>(tx: Executor, req: RememberedRequest): Promise<T | null> {
  const requestHash = hashOf(req.request);
  const claimed = await tx
    .insert(idempotencyKeys)
    .values({ operationId: req.operationId, key: req.key, route: req.route, requestHash })
    .onConflictDoNothing()
    .returning({ key: idempotencyKeys.key });
  if (claimed.length > 0) return null;
  const [earlier] = await tx
    .select()
    .from(idempotencyKeys)
    .where(and(eq(idempotencyKeys.operationId, req.operationId), eq(idempotencyKeys.key, req.key)));
  if (!earlier || earlier.route !== req.route || earlier.requestHash !== requestHash) {
    throw invalid('Idempotency-Key', 'This key was already used for a different request; use a new key for a new request.');
  }
  return earlier.response as T;
}

export async function saveIdempotentResult(tx: Executor, req: Pick<RememberedRequest, 'operationId' | 'key'>, result: object): Promise<void> {
  await tx
    .update(idempotencyKeys)
    .set({ statusCode: 200, response: result })
    .where(and(eq(idempotencyKeys.operationId, req.operationId), eq(idempotencyKeys.key, req.key)));
}
