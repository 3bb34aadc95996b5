import { Inject, Injectable, Logger } from '@nestjs/common';
import nodemailer, { type Transporter } from 'nodemailer';
import { APP_CONFIG, type AppConfig } from './config.js';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html?: string;
  attachments?: { filename: string; content: Buffer; contentType: string }[];
}

/** Sends through the configured SMTP server (the local mail catcher in development and tests). */
@Injectable()
export class MailService {
  private readonly logger = new Logger('Mail');
  private readonly transport: Transporter;

  constructor(@Inject(APP_CONFIG) private readonly config: AppConfig) {
    this.transport = nodemailer.createTransport({
      host: config.smtpHost,
      port: config.smtpPort,
      secure: false,
      ignoreTLS: true,
      connectionTimeout: 5000,
      greetingTimeout: 5000,
    });
  }

  /** Resolves false instead of throwing: a mail server outage must not undo the action that sent the mail. */
  async send(mail: OutgoingMail): Promise<boolean> {
    try {
      await this.transport.sendMail({ from: this.config.mailFrom, ...mail });
      return true;
    } catch (err) {
      this.logger.warn(`Could not send "${mail.subject}": ${err instanceof Error ? err.message : String(err)}`);
      return false;
    }
  }
}
