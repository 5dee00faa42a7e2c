/**
 * Outgoing mail through nodemailer over SMTP. With `SMTP_URL` set, nodemailer sends through it; without,
 * the server starts its local fake mail server (fake-smtp.ts) and sends there, so invitations and review
 * requests can be read at `GET /api/dev/mailbox` (outside production). `close()` stops the fake server.
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

export async function createMailer(
  config: Pick<Config, 'smtpUrl' | 'mailFrom' | 'nodeEnv'>,
  logger: Logger,
): Promise<Mailer> {
  const mailbox = config.smtpUrl ? null : await startFakeSmtpServer();
  if (mailbox && config.nodeEnv === 'production')
    logger.warn('SMTP_URL is not set: mail goes to the local fake mail server and is not delivered');
  const transport = config.smtpUrl
    ? nodemailer.createTransport(config.smtpUrl)
    : nodemailer.createTransport({
        host: mailbox!.host,
        port: mailbox!.port,
        secure: false,
        ignoreTLS: true,
      });

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
