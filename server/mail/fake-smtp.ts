/**
 * A local fake mail server for development and tests: a real SMTP server (smtp-server) on 127.0.0.1 and
 * a free port that accepts every message and keeps the newest ones in memory, readable at
 * `GET /api/dev/mailbox`. Nothing leaves the machine.
 */
import type { AddressInfo } from 'node:net';
import { SMTPServer } from 'smtp-server';
import { readMessage } from './mime';

export interface MailboxMessage {
  /** The envelope recipients, comma-separated. */
  to: string;
  subject: string;
  text: string;
  html: string | null;
  /** Unix milliseconds when the fake server received it. */
  sentAt: number;
}

export interface FakeSmtpServer {
  host: string;
  port: number;
  /** Newest first. */
  messages(): MailboxMessage[];
  clear(): void;
  close(): Promise<void>;
}

/** Messages kept; older ones are dropped first. */
export const MAILBOX_LIMIT = 200;
/** Largest message accepted (bytes). */
export const MAILBOX_MESSAGE_BYTES = 2 * 1024 * 1024;

export async function startFakeSmtpServer(options: { limit?: number } = {}): Promise<FakeSmtpServer> {
  const limit = options.limit ?? MAILBOX_LIMIT;
  let box: MailboxMessage[] = [];

  const smtp = new SMTPServer({
    secure: false,
    authOptional: true,
    disabledCommands: ['AUTH', 'STARTTLS'],
    hideSTARTTLS: true,
    logger: false,
    size: MAILBOX_MESSAGE_BYTES,
    banner: 'Matchloom local mailbox',
    // Senders here close after each message; do not wait long for a stuck one at shutdown.
    closeTimeout: 1000,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', () => {
        if ((stream as { sizeExceeded?: boolean }).sizeExceeded) {
          callback(Object.assign(new Error('message too large'), { responseCode: 552 }));
          return;
        }
        try {
          const read = readMessage(Buffer.concat(chunks));
          const recipients = session.envelope.rcptTo.map((r) => r.address).join(', ');
          box = [
            {
              to: recipients || read.to,
              subject: read.subject,
              text: read.text,
              html: read.html,
              sentAt: Date.now(),
            },
            ...box,
          ].slice(0, limit);
          callback();
        } catch (e) {
          callback(e as Error);
        }
      });
    },
  });
  // A client that drops its connection is no error of ours.
  smtp.on('error', () => undefined);

  const host = '127.0.0.1';
  const server = await new Promise<ReturnType<SMTPServer['listen']>>((resolve, reject) => {
    const s = smtp.listen(0, host, () => resolve(s));
    s.once('error', reject);
  });
  const port = (server.address() as AddressInfo).port;

  return {
    host,
    port,
    messages: () => box.map((m) => ({ ...m })),
    clear() {
      box = [];
    },
    close: () => new Promise<void>((resolve) => smtp.close(() => resolve())),
  };
}
