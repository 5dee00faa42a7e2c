/**
 * Outgoing mail through nodemailer over SMTP. With `SMTP_URL` set, nodemailer sends through it; without,
 * outside production, the server starts its local fake mail server (fake-smtp.ts) and sends there, so
 * invitations and review requests can be read at `GET /api/dev/mailbox`. In production without
 * `SMTP_URL` nothing can be delivered: `send` rejects (callers report the mail as not sent).
 * `close()` stops the fake server.
 */
import nodemailer from 'nodemailer';
import type { Config } from '../config';
import type { Logger } from '../logger';
import { startFakeSmtpServer, type FakeSmtpServer } from './fake-smtp';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html?: string;
}

export interface Mailer {
  /** Send one message; resolves once the SMTP server accepted it, rejects when it did not. */
  send(mail: OutgoingMail): Promise<void>;
  /** The local fake server and its mailbox, when SMTP_URL is unset; null otherwise. */
  readonly mailbox: FakeSmtpServer | null;
  close(): Promise<void>;
}

/** A mail server that does not answer must not hold a request for minutes (nodemailer waits 2 min). */
const TIMEOUTS = { connectionTimeout: 10_000, greetingTimeout: 10_000, socketTimeout: 30_000 };

export async function createMailer(
  config: Pick<Config, 'smtpUrl' | 'mailFrom' | 'nodeEnv'>,
  logger: Logger,
): Promise<Mailer> {
  if (!config.smtpUrl && config.nodeEnv === 'production') {
    logger.warn('SMTP_URL is not set: invitations and review requests cannot be mailed');
    return {
      mailbox: null,
      send: () => Promise.reject(new Error('SMTP_URL is not set: mail cannot be delivered')),
      close: async () => undefined,
    };
  }
  const mailbox = config.smtpUrl ? null : await startFakeSmtpServer();
  const transport = mailbox
    ? nodemailer.createTransport({
        host: mailbox.host,
        port: mailbox.port,
        secure: false,
        ignoreTLS: true,
        ...TIMEOUTS,
      })
    : nodemailer.createTransport({ url: config.smtpUrl, ...TIMEOUTS });

  return {
    mailbox,
    async send(mail) {
      await transport.sendMail({ from: config.mailFrom, ...mail });
    },
    async close() {
      transport.close();
      await mailbox?.close();
    },
  };
}
