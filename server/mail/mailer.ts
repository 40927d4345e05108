import nodemailer from 'nodemailer';
import { startFakeSmtp, type FakeSmtp } from './fake-smtp';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html: string;
}

export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
  /** The local mail catcher, when it is in use (no SMTP_URL). */
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
  return {
    fake,
    async send(mail) {
      await transport.sendMail({ from: config.from, ...mail });
    },
    async close() {
      transport.close();
      await fake?.close();
    },
  };
}
