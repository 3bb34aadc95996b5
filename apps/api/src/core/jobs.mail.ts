import { createCipheriv, createDecipheriv, hkdfSync, randomBytes } from 'node:crypto';
import { Inject, Injectable, Logger, type OnModuleInit } from '@nestjs/common';
import type { Executor } from '@hitchbook/db';
import { APP_CONFIG, type AppConfig } from './config.js';
import { JobsService } from './jobs.service.js';
import { MailService, type OutgoingMail } from './mail.service.js';

export const MAIL_QUEUE = 'mail';

type PlainMail = Omit<OutgoingMail, 'attachments'>;

interface MailJob {
  /** base64 of iv | auth tag | AES-256-GCM ciphertext of the mail as JSON. */
  sealed: string;
}

/**
 * E-mails sent through the job queue: a failed send is retried with backoff and never fails the action
 * that asked for it. Mails can carry sign-in links, so the queue stores them sealed with a key derived
 * from the server secret; a database reader learns nothing from the job table.
 */
@Injectable()
export class MailQueue implements OnModuleInit {
  private readonly logger = new Logger('MailQueue');
  private readonly key: Buffer;

  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    @Inject(JobsService) private readonly jobs: JobsService,
    @Inject(MailService) private readonly mail: MailService,
  ) {
    this.key = Buffer.from(hkdfSync('sha256', config.jwtSecret, 'hitchbook', 'mail-queue-v1', 32));
  }

  onModuleInit(): void {
    this.jobs.register<MailJob>({
      name: MAIL_QUEUE,
      retryLimit: this.config.jobs.mailRetryLimit,
      retryDelaySeconds: this.config.jobs.mailRetryDelaySeconds,
      expireInSeconds: 120,
      handle: async (job) => deliverOrThrow(this.mail, this.unseal(job.sealed)),
    });
  }

  /** Queues the mail and answers the job id; with a transaction, the job exists only if it commits. */
  enqueue(mail: PlainMail, executor?: Executor): Promise<string> {
    return this.jobs.send<MailJob>(MAIL_QUEUE, { sealed: this.seal(mail) }, executor);
  }

  /** For callers that must answer at the same speed whether or not a mail goes out. */
  enqueueInBackground(mail: PlainMail): void {
    this.enqueue(mail).catch((err: unknown) => this.logger.error(`Could not queue "${mail.subject}": ${err instanceof Error ? err.message : String(err)}`));
  }

  private seal(mail: PlainMail): string {
    const iv = randomBytes(12);
    const cipher = createCipheriv('aes-256-gcm', this.key, iv);
    const body = Buffer.concat([cipher.update(JSON.stringify(mail), 'utf8'), cipher.final()]);
    return Buffer.concat([iv, cipher.getAuthTag(), body]).toString('base64');
  }

  private unseal(sealed: string): PlainMail {
    const raw = Buffer.from(sealed, 'base64');
    const decipher = createDecipheriv('aes-256-gcm', this.key, raw.subarray(0, 12));
    decipher.setAuthTag(raw.subarray(12, 28));
    return JSON.parse(Buffer.concat([decipher.update(raw.subarray(28)), decipher.final()]).toString('utf8')) as PlainMail;
  }
}

/** The mail service reports failure as false; a queued job must throw to be retried. */
export async function deliverOrThrow(mail: MailService, message: OutgoingMail): Promise<void> {
  if (!(await mail.send(message))) throw new Error(`"${message.subject}" was not accepted by the mail server`);
}
