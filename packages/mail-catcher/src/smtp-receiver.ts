import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';
import { toStoredMessage } from './message.js';
import type { MessageStore } from './message-store.js';

export const MAX_MESSAGE_BYTES = 10 * 1024 * 1024;

export function createSmtpReceiver(store: MessageStore): SMTPServer {
  return new SMTPServer({
    // A local catcher: no TLS to negotiate and no accounts, any sender may deliver.
    disabledCommands: ['STARTTLS', 'AUTH'],
    authOptional: true,
    logger: false,
    banner: 'Hitchbook mail catcher',
    size: MAX_MESSAGE_BYTES,
    closeTimeout: 1000,
    onData(stream, session, callback) {
      simpleParser(stream).then(
        (parsed) => {
          if (stream.sizeExceeded) {
            const error = Object.assign(new Error(`Message is larger than the ${MAX_MESSAGE_BYTES / 1024 / 1024} MB limit`), {
              responseCode: 552,
            });
            return callback(error);
          }
          store.add(toStoredMessage(store.nextId(), parsed, session.envelope, new Date()));
          callback();
        },
        (error: unknown) => callback(error instanceof Error ? error : new Error(String(error))),
      );
    },
  });
}
