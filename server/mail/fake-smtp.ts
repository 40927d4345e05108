import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';

/** A message the local fake SMTP server caught. */
export interface CaughtMessage {
  id: number;
  /** The Message-ID header as sent (empty when the message had none). */
  messageId: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string;
  /** The List-Unsubscribe and List-Unsubscribe-Post headers, when present. */
  listUnsubscribe?: string;
  listUnsubscribePost?: string;
  receivedAt: string;
}

export interface FakeSmtp {
  host: string;
  port: number;
  messages: CaughtMessage[];
  /** Refuse (or accept again) every message: for the "SMTP down" tests. */
  setDown(down: boolean): void;
  close(): Promise<void>;
}

/**
 * A local SMTP server that catches what the app sends (development and tests, when no SMTP_URL
 * is configured). smtp-server receives, mailparser parses; nothing leaves the machine.
 */
export async function startFakeSmtp(options: { port?: number; host?: string; keep?: number } = {}): Promise<FakeSmtp> {
  const messages: CaughtMessage[] = [];
  const keep = options.keep ?? 500;
  let down = false;
  let nextId = 1;
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['AUTH', 'STARTTLS'],
    banner: 'Lullwatch local mailbox',
    logger: false,
    onData(stream, session, callback) {
      if (down) {
        stream.resume();
        stream.on('end', () => {
          const err = new Error('Local mailbox is down (test switch)') as Error & { responseCode: number };
          err.responseCode = 451;
          callback(err);
        });
        return;
      }
      simpleParser(stream)
        .then((mail) => {
          messages.push({
            id: nextId++,
            messageId: mail.messageId ?? '',
            from: mail.from?.text ?? '',
            to: session.envelope.rcptTo.map((r) => r.address),
            subject: mail.subject ?? '',
            text: mail.text ?? '',
            html: typeof mail.html === 'string' ? mail.html : '',
            listUnsubscribe: headerLine(mail.headerLines, 'list-unsubscribe'),
            listUnsubscribePost: headerLine(mail.headerLines, 'list-unsubscribe-post'),
            receivedAt: new Date().toISOString(),
          });
          if (messages.length > keep) messages.splice(0, messages.length - keep);
          callback();
        })
        .catch((err: Error) => callback(err));
    },
  });
  const host = options.host ?? '127.0.0.1';
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 0, host, () => resolve());
  });
  const address = server.server.address();
  const port = typeof address === 'object' && address ? address.port : 0;
  return {
    host,
    port,
    messages,
    setDown: (d) => {
      down = d;
    },
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

/** A header's value as sent (its raw line without the name). */
function headerLine(lines: readonly { key: string; line: string }[], key: string): string | undefined {
  const found = lines.find((l) => l.key === key);
  return found
    ? found.line
        .slice(found.line.indexOf(':') + 1)
        .replace(/\r?\n\s+/g, ' ')
        .trim()
    : undefined;
}
