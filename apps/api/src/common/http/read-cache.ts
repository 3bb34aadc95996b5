import { type CallHandler, type ExecutionContext, Injectable, type NestInterceptor, StreamableFile, UseInterceptors, applyDecorators } from '@nestjs/common';
import { promisify } from 'node:util';
import { gzip } from 'node:zlib';
import type { NextFunction, Request, Response } from 'express';
import { LRUCache } from 'lru-cache';
import { type Observable, from, lastValueFrom, map, of } from 'rxjs';
import type { Actor, RequestWithActor } from '../auth/actor.js';
import { bearerTokenOf } from '../auth/bearer.js';

/** What the kept answers may take of the API's memory, in bytes of their JSON. */
const MAX_BYTES = 64 * 1024 * 1024;
/**
 * How long an answer is kept when nothing is written. Answers also depend on the date ("overdue" invoices,
 * a statement's time of computing), so none outlives a minute, and the key names the day.
 */
const TTL_MS = 60_000;
/** Below this an answer is sent as it is: a small one gains fewer bytes than the gzip header costs to read. */
const GZIP_FROM_BYTES = 1024;

const gzipAsync = promisify(gzip);

/** An answer as the bytes sent: its JSON, and that JSON gzipped once for the clients that accept it. */
export interface KeptAnswer {
  json: Buffer;
  gzip: Buffer | null;
}

/** Encodes an answer once for every request it is kept for, on zlib's thread pool rather than the event loop. */
export async function keptAnswerOf(answer: unknown): Promise<KeptAnswer> {
  const json = Buffer.from(JSON.stringify(answer));
  return { json, gzip: json.length >= GZIP_FROM_BYTES ? await gzipAsync(json) : null };
}

/**
 * Answers of the heaviest reads (list pages, a year's reports), kept as their JSON under the operation's data
 * version. Every committed write to an operation's rows moves the version (migration 0012), and the version
 * is read with the caller's role before the answer is computed, so a kept answer is never older than its
 * key: a write makes every kept answer of that operation unreachable at once, on every API instance. The
 * key also names the membership (its role and household decide what an answer holds; changing either is a write
 * that moves the version) and the whole request URL.
 */
@Injectable()
export class ReadCache {
  private readonly answers = new LRUCache<string, KeptAnswer>({
    maxSize: MAX_BYTES,
    sizeCalculation: (answer, key) => answer.json.length + (answer.gzip?.length ?? 0) + key.length,
    ttl: TTL_MS,
  });

  keyOf(req: Request & RequestWithActor): string | null {
    const actor = req.actor;
    if (!actor?.dataVersion) return null;
    const day = new Date().toISOString().slice(0, 10);
    return [actor.operationId, actor.dataVersion, actor.membershipId, day, req.originalUrl].join('\u0000');
  }

  /** Answers being computed, so that requests arriving meanwhile for the same key wait for that one. */
  private readonly pending = new Map<string, Promise<KeptAnswer>>();

  get(key: string): KeptAnswer | undefined {
    return this.answers.get(key);
  }

  set(key: string, answer: KeptAnswer): void {
    this.answers.set(key, answer);
  }

  /**
   * The answer computed once for every request asking for the same key at the same time: when a page's kept
   * answer runs out (a write, the minute) under load, one request computes it instead of each of them at once.
   * A failure reaches every request that waited for it, as each would have met it on its own; nothing is kept.
   */
  shared(key: string, compute: () => Promise<KeptAnswer>): Promise<KeptAnswer> {
    const running = this.pending.get(key);
    if (running) return running;
    const computing = compute().finally(() => this.pending.delete(key));
    this.pending.set(key, computing);
    return computing;
  }
}

/**
 * Runs after the guard, so the caller is known and allowed, and before the route's pipes, so a kept answer
 * skips validating the query too: only a URL that once passed validation has an answer kept. Requests that
 * arrive while the same answer is being computed wait for it instead of computing it again. A request
 * sent with `Cache-Control: no-cache` is computed afresh (and its answer kept), as HTTP has it. The answer is
 * kept as the bytes sent and handed to the socket as they are: encoding a string anew for every request made
 * the busiest lists allocate tens of megabytes a second. A client that accepts gzip (every browser does) gets
 * the answer gzipped once when it was kept: a page of fifty entries is about a tenth of its JSON on a phone's
 * connection, and the API writes that much less to each socket.
 */
@Injectable()
export class ReadCacheInterceptor implements NestInterceptor {
  constructor(private readonly cache: ReadCache) {}

  intercept(context: ExecutionContext, next: CallHandler): Observable<unknown> {
    const http = context.switchToHttp();
    const req = http.getRequest<Request & RequestWithActor>();
    const key = this.cache.keyOf(req);
    if (key === null) return next.handle();
    const compute = () =>
      lastValueFrom(next.handle())
        .then(keptAnswerOf)
        .then((answer) => {
          this.cache.set(key, answer);
          return answer;
        });
    const send = (answer: KeptAnswer) => asJson(answer, req, http.getResponse<Response>());
    // Asked afresh, the request computes its own answer rather than wait for one begun before it arrived.
    if (freshRequested(req)) return from(compute()).pipe(map(send));
    const kept = this.cache.get(key);
    if (kept !== undefined) return of(send(kept));
    return from(this.cache.shared(key, compute)).pipe(map(send));
  }
}

/** The bytes of a kept answer this request gets, with the headers that say which. */
function encodedFor(answer: KeptAnswer, req: Request, res: Response): Buffer {
  if (!answer.gzip) return answer.json;
  res.setHeader('Vary', 'Accept-Encoding');
  if (req.acceptsEncodings('gzip', 'identity') !== 'gzip') return answer.json;
  res.setHeader('Content-Encoding', 'gzip');
  return answer.gzip;
}

function asJson(answer: KeptAnswer, req: Request, res: Response): StreamableFile {
  const body = encodedFor(answer, req, res);
  return new StreamableFile(body, { type: 'application/json; charset=utf-8', length: body.length });
}

/**
 * A GET whose answer is kept is answered before it reaches the Nest router: the bearer token is checked and the
 * member read as the guard does (the guard then uses that member rather than read it again), and a kept answer is
 * sent in one write. A key exists only for an answer the interceptor kept, that is, one a request of the same
 * membership passed the route's guards for, at the same data version, for the same URL and day; a change of role
 * or household is a write that moves the version, so the guards would let this request through as well.
 * Anything else, a failure included, goes on to the router as before.
 */
export function keptAnswersFirst(cache: ReadCache, actorOf: (token: string) => Promise<Actor | null>) {
  return (req: Request & RequestWithActor, res: Response, next: NextFunction): void => {
    const token = bearerTokenOf(req);
    if (req.method !== 'GET' || token === null || freshRequested(req)) return next();
    actorOf(token).then(
      (actor) => {
        if (!actor) return next();
        req.actor = actor;
        const key = cache.keyOf(req);
        const kept = key === null ? undefined : cache.get(key);
        if (kept === undefined) return next();
        const body = encodedFor(kept, req, res);
        res.writeHead(200, { 'Content-Type': 'application/json; charset=utf-8', 'Content-Length': body.length });
        res.end(body);
      },
      () => next(),
    );
  };
}

function freshRequested(req: Request): boolean {
  const header = req.headers['cache-control'];
  return typeof header === 'string' && /(^|,)\s*no-cache\s*(,|$)/i.test(header);
}

/** Keeps a GET route's JSON answer until the operation's data changes; only for answers that are plain JSON. */
export const KeptUntilDataChanges = () => applyDecorators(UseInterceptors(ReadCacheInterceptor));
