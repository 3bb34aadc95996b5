import { Global, Module } from '@nestjs/common';
import { MailQueue } from './jobs.mail.js';
import { JobsService } from './jobs.service.js';

/** The PostgreSQL job queue and the queued e-mail built on it, for every feature module. */
@Global()
@Module({
  providers: [JobsService, MailQueue],
  exports: [JobsService, MailQueue],
})
export class JobsModule {}
