import nodemailer from 'nodemailer';
import { startFakeSmtp, type FakeSmtp } from './fake-smtp';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html: string;
  /**
   * A stable id for the Message-ID header (`<id@sender's domain>`): a message sent again after a
   * crash carries the same Message-ID, so mail systems can tell it is the same message.
   */
  messageId?: string;
  /** Extra headers (List-Unsubscribe and List-Unsubscribe-Post, RFC 2369 and RFC 8058). */
  headers?: Record<string, string>;
}

export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
  /** The local mailbox, when it is in use (no SMTP_URL). */
  fake?: FakeSmtp;
  close(): Promise<void>;
}

/**
 * nodemailer over SMTP: the server in `smtpUrl`, or a local fake SMTP server started here when
 * none is configured (development and tests).
 */
export async function createMailer(config: { smtpUrl?: string; from: string }): Promise<Mailer> {
  let fake: FakeSmtp | undefined;
  let transport: ReturnType<typeof nodemailer.createTransport>;
  if (config.smtpUrl) {
    transport = nodemailer.createTransport(config.smtpUrl);
  } else {
    fake = await startFakeSmtp();
    transport = nodemailer.createTransport({ host: fake.host, port: fake.port, secure: false, ignoreTLS: true });
  }
  const domain = /@([^>\s]+)>?\s*$/.exec(config.from)?.[1] ?? 'lullwatch.invalid';
  return {
    fake,
    async send({ messageId, ...mail }) {
      await transport.sendMail({ from: config.from, ...mail, ...(messageId ? { messageId: `<${messageId}@${domain}>` } : {}) });
    },
    async close() {
      transport.close();
      await fake?.close();
    },
  };
}
