import { randomUUID } from 'node:crypto';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { type LogLevel } from '@nestjs/common';
import { NestFactory } from '@nestjs/core';
import type { NestExpressApplication } from '@nestjs/platform-express';
import cookieParser from 'cookie-parser';
import type { NextFunction, Request, Response } from 'express';
import expressStaticGzip from 'express-static-gzip';
import helmet from 'helmet';
import { AppModule } from './app.module.js';
import { ErrorFilter } from './common/errors/error.filter.js';
import { refuseOversizedJson } from './common/http/json-body-limit.js';
import { keptAnswersFirst, ReadCache } from './common/http/read-cache.js';
import type { AppConfig } from './core/config.js';
import { SessionService } from './modules/auth/session.service.js';

export const JSON_BODY_LIMIT_BYTES = 256 * 1024;

export interface CreateAppOptions {
  logger?: LogLevel[] | false;
}

export async function createApp(config: AppConfig, options: CreateAppOptions = {}): Promise<NestExpressApplication> {
  const app = await NestFactory.create<NestExpressApplication>(AppModule.forRoot(config), {
    rawBody: true,
    logger: options.logger ?? ['error', 'warn'],
  });
  return configureApp(app, config);
}

/** Everything around the Nest modules: shared by the server and by the tests' testing-module apps. */
export function configureApp(app: NestExpressApplication, config: AppConfig): NestExpressApplication {
  app.set('trust proxy', false);
  app.disable('x-powered-by');
  // Every API answer is sent with Cache-Control: no-store, so no client ever revalidates it; hashing each body
  // for an ETag would cost time on the largest answers for nothing. The web app's files carry their own.
  app.set('etag', false);
  app.use(securityHeaders(config));
  app.use(refuseOversizedJson(JSON_BODY_LIMIT_BYTES));
  app.useBodyParser('json', { limit: JSON_BODY_LIMIT_BYTES });
  app.use(cookieParser());
  app.use(requestId);
  app.use('/api', noStore);
  const sessions = app.get(SessionService);
  app.use('/api', keptAnswersFirst(app.get(ReadCache), (token) => sessions.actorFromAccessToken(token)));
  if (config.webDist) serveWebApp(app, config.webDist);
  app.setGlobalPrefix('api');
  app.useGlobalFilters(new ErrorFilter());
  return app;
}

function securityHeaders(config: AppConfig) {
  const https = config.appUrl.startsWith('https:');
  return helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        defaultSrc: ["'self'"],
        scriptSrc: ["'self'"],
        // Mantine sets CSS variables and inline style attributes at run time.
        styleSrc: ["'self'", "'unsafe-inline'"],
        imgSrc: ["'self'", 'data:', 'blob:'],
        fontSrc: ["'self'", 'data:'],
        connectSrc: ["'self'"],
        workerSrc: ["'self'"],
        manifestSrc: ["'self'"],
        objectSrc: ["'none'"],
        baseUri: ["'none'"],
        formAction: ["'self'"],
        frameAncestors: ["'none'"],
        ...(https ? { upgradeInsecureRequests: [] } : {}),
      },
    },
    strictTransportSecurity: https ? { maxAge: 31536000, includeSubDomains: true } : false,
    crossOriginEmbedderPolicy: false,
    referrerPolicy: { policy: 'same-origin' },
  });
}

function requestId(req: Request & { requestId?: string }, res: Response, next: NextFunction): void {
  req.requestId = randomUUID();
  res.setHeader('X-Request-Id', req.requestId);
  next();
}

function noStore(_req: Request, res: Response, next: NextFunction): void {
  res.setHeader('Cache-Control', 'no-store');
  next();
}

/**
 * The API serves the built web app on the same origin; unknown non-API paths get the app shell. The build
 * writes each file's Brotli and gzip copies beside it, and a browser gets the smallest it accepts: on a
 * phone's weak connection the cab form's code is a third of its size as it was built.
 */
function serveWebApp(app: NestExpressApplication, webDist: string): void {
  const index = join(webDist, 'index.html');
  if (!existsSync(index)) return;
  const files = expressStaticGzip(webDist, {
    enableBrotli: true,
    orderPreference: ['br', 'gzip'],
    index: false,
    serveStatic: {
      index: false,
      setHeaders: (res, path) => {
        res.setHeader('Cache-Control', path.includes(`${join(webDist, 'assets')}`) ? 'public, max-age=31536000, immutable' : 'no-cache');
      },
    },
  });
  const isApi = (req: Request) => req.path.startsWith('/api/') || req.path === '/api';
  // An API request never names a file of the web app: without this each one would cost a file-system lookup.
  app.use((req: Request, res: Response, next: NextFunction) => (isApi(req) ? next() : files(req, res, next)));
  app.use((req: Request, res: Response, next: NextFunction) => {
    if ((req.method === 'GET' || req.method === 'HEAD') && !isApi(req)) {
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile(index);
      return;
    }
    next();
  });
}
