import type { EventEmitter } from 'node:events';
import { createServer } from 'node:http';
import type { AddressInfo, Server } from 'node:net';
import type { SMTPServer } from 'smtp-server';
import { createRequestHandler } from './http-api.js';
import { MessageStore } from './message-store.js';
import { createSmtpReceiver } from './smtp-receiver.js';

export type { AttachmentSummary, MessageDetail, MessageSummary } from './message.js';

export interface MailCatcherOptions {
  host?: string;
  smtpPort?: number;
  httpPort?: number;
  /** How many messages are kept; older ones are dropped. */
  maxMessages?: number;
}

export interface RunningMailCatcher {
  smtpPort: number;
  httpPort: number;
  stop(): Promise<void>;
}

export async function startMailCatcher({
  host = '127.0.0.1',
  smtpPort = 0,
  httpPort = 0,
  maxMessages = 500,
}: MailCatcherOptions = {}): Promise<RunningMailCatcher> {
  const store = new MessageStore(maxMessages);
  const smtp = createSmtpReceiver(store);
  const http = createServer(createRequestHandler(store));

  const boundSmtp = await listen('SMTP', smtp, smtp.server, host, smtpPort, (cb) => smtp.listen(smtpPort, host, cb));
  // A client that drops its connection mid-delivery must not bring the catcher down.
  smtp.on('error', (error: Error) => console.error(`mail catcher: SMTP connection error: ${error.message}`));
  let boundHttp: number;
  try {
    boundHttp = await listen('web inbox', http, http, host, httpPort, (cb) => http.listen(httpPort, host, cb));
  } catch (error) {
    await closeSmtp(smtp);
    throw error;
  }

  return {
    smtpPort: boundSmtp,
    httpPort: boundHttp,
    async stop() {
      http.closeAllConnections();
      await Promise.all([closeSmtp(smtp), new Promise<void>((resolve) => http.close(() => resolve()))]);
    },
  };
}

function listen(
  label: string,
  errors: EventEmitter,
  server: Server,
  host: string,
  port: number,
  start: (cb: () => void) => void,
): Promise<number> {
  return new Promise((resolve, reject) => {
    const onError = (error: NodeJS.ErrnoException) => {
      const reason =
        error.code === 'EADDRINUSE'
          ? `port ${port} on ${host} is already in use`
          : error.code === 'EACCES'
            ? `no permission to listen on ${host}:${port}`
            : error.message;
      reject(new Error(`Mail catcher ${label} could not start: ${reason}`));
    };
    errors.once('error', onError);
    start(() => {
      errors.off('error', onError);
      resolve((server.address() as AddressInfo).port);
    });
  });
}

function closeSmtp(smtp: SMTPServer): Promise<void> {
  return new Promise((resolve) => smtp.close(() => resolve()));
}
