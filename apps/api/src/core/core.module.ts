import { type DynamicModule, Global, Module } from '@nestjs/common';
import { JwtModule } from '@nestjs/jwt';
import { createDb } from '@hitchbook/db';
import { ReadCache } from '../common/http/read-cache.js';
import { AuditService } from './audit.service.js';
import { APP_CONFIG, type AppConfig } from './config.js';
import { DB, type DbHandle } from './database.js';
import { MailService } from './mail.service.js';
import { RateLimitService } from './rate-limit.service.js';

/** Configuration, the database pool and the cross-cutting services every feature module may inject. */
@Global()
@Module({})
export class CoreModule {
  static forRoot(config: AppConfig): DynamicModule {
    return {
      module: CoreModule,
      imports: [JwtModule.register({ secret: config.jwtSecret, signOptions: { algorithm: 'HS256' }, verifyOptions: { algorithms: ['HS256'] } })],
      providers: [
        { provide: APP_CONFIG, useValue: config },
        { provide: DB, useFactory: (): DbHandle => createDb(config.databaseUrl, { max: 10, applicationName: 'hitchbook-api', idleInTransactionTimeoutMs: 60_000 }) },
        AuditService,
        MailService,
        RateLimitService,
        ReadCache,
      ],
      exports: [APP_CONFIG, DB, JwtModule, AuditService, MailService, RateLimitService, ReadCache],
    };
  }
}
