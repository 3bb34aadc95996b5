import { randomUUID } from 'node:crypto';
import { type ArgumentsHost, Catch, type ExceptionFilter, HttpException, Logger } from '@nestjs/common';
import type { Request, Response } from 'express';
import { ComputationError } from '@hitchbook/shared/errors';
import { AppError, statusOf, type FieldIssue } from './app-error.js';

/** The request id travels in the X-Request-Id header only, so two refusals of the same kind have identical bodies. */
interface ErrorBody {
  message: string;
  issues?: FieldIssue[];
}

// SQLSTATE classes and driver codes that mean "the database is not reachable right now", not a bug.
const DB_DOWN_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', '57P01', '57P02', '57P03', '08000', '08003', '08006', '08001', '08004']);

export function isDatabaseDown(err: unknown): boolean {
  let e: unknown = err;
  for (let depth = 0; e && depth < 4; depth++) {
    const code = (e as { code?: unknown }).code;
    if (typeof code === 'string' && DB_DOWN_CODES.has(code)) return true;
    const message = (e as { message?: unknown }).message;
    if (typeof message === 'string' && /Connection terminated|timeout exceeded when trying to connect|Client has encountered a connection error/i.test(message)) return true;
    e = (e as { cause?: unknown }).cause;
  }
  return false;
}

const HTTP_MESSAGES: Record<number, string> = {
  400: 'The request could not be read.',
  401: 'Sign in first.',
  403: 'Your role may not do this.',
  404: 'Not found.',
  405: 'Method not allowed.',
  413: 'The request is too large.',
  415: 'Unsupported content type.',
  429: 'Too many requests; wait a moment and try again.',
};

/** Turns every failure into the API's error body; never lets a stack trace or SQL reach the caller. */
@Catch()
export class ErrorFilter implements ExceptionFilter {
  private readonly logger = new Logger('Errors');

  catch(exception: unknown, host: ArgumentsHost): void {
    const http = host.switchToHttp();
    const res = http.getResponse<Response>();
    const req = http.getRequest<Request & { requestId?: string }>();
    const requestId = req.requestId ?? randomUUID();
    const { status, body, retryAfter } = this.describe(exception);
    if (status >= 500 && status !== 503) {
      this.logger.error(`${req.method} ${req.originalUrl} failed [${requestId}]`, exception instanceof Error ? exception.stack : String(exception));
    }
    if (res.headersSent) return;
    if (retryAfter) res.setHeader('Retry-After', String(retryAfter));
    res.status(status).json(body);
  }

  private describe(exception: unknown): { status: number; body: ErrorBody; retryAfter?: number } {
    if (exception instanceof AppError) {
      const body: ErrorBody = { message: exception.message };
      if (exception.issues.length > 0) body.issues = exception.issues;
      return { status: statusOf(exception.code), body, retryAfter: exception.retryAfterSeconds };
    }
    // The engine refuses inputs its schemas let through only in combinations; that is still the caller's input.
    if (exception instanceof ComputationError) {
      return { status: 400, body: { message: exception.message } };
    }
    if (exception instanceof HttpException) {
      const status = exception.getStatus();
      if (status === 400 && /JSON/i.test(JSON.stringify(exception.getResponse()))) {
        return { status, body: { message: 'The request body is not valid JSON.' } };
      }
      return { status, body: { message: HTTP_MESSAGES[status] ?? 'The request failed.' } };
    }
    // Errors raised by Express's body parser before any route runs.
    const parserStatus = (exception as { status?: unknown; type?: unknown }).status;
    if (typeof parserStatus === 'number' && parserStatus >= 400 && parserStatus < 500) {
      const type = (exception as { type?: unknown }).type;
      const message = type === 'entity.parse.failed' ? 'The request body is not valid JSON.' : (HTTP_MESSAGES[parserStatus] ?? 'The request could not be read.');
      return { status: parserStatus, body: { message } };
    }
    if (isDatabaseDown(exception)) {
      return { status: 503, body: { message: 'The database is not reachable right now; try again shortly.' }, retryAfter: 5 };
    }
    return { status: 500, body: { message: 'Something went wrong on our side.' } };
  }
}
