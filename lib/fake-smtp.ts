/**
 * The local fake mail server for the demo and the tests: an SMTP listener on
 * 127.0.0.1 that accepts every message and keeps it, one row per envelope
 * recipient, in the `mailbox` table of the app's SQLite database. Nothing is
 * ever relayed. Started by scripts/fake-smtp.ts (demo) and by the test setup.
 */
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import { openDatabase, type OpenDb } from '@/db/connection';
import { storeMail } from '@/db/queries/mailbox';

/** What the mailbox keeps of a message: decoded subject, sender, team header and the first text and HTML parts. */
export interface ReadMail {
  subject: string;
  /** The From header's first address; '' when none. */
  fromAddress: string;
  /** X-Phasewright-Team as a positive integer, else null. */
  teamId: number | null;
  text: string;
  html: string;
}

/** A raw message read by mailparser (headers, encoded words, multipart, transfer encodings, charsets). */
export async function readMail(raw: Buffer | string): Promise<ReadMail> {
  const m = await simpleParser(raw, { skipHtmlToText: true, skipTextToHtml: true, skipImageLinks: true, skipTextLinks: true });
  const team = Number(m.headers.get('x-phasewright-team'));
  return {
    subject: m.subject ?? '',
    fromAddress: m.from?.value[0]?.address ?? '',
    teamId: Number.isInteger(team) && team > 0 ? team : null,
    text: m.text ?? '',
    html: m.html || '',
  };
}

export interface FakeSmtp {
  port: number;
  /** Messages stored so far (rows, counting each recipient). */
  count: () => number;
  close: () => Promise<void>;
}

export interface FakeSmtpOptions {
  port: number;
  host?: string;
  /** The database file, or a getter when it is known only after the server starts. */
  database: string | (() => string);
  /** Largest message accepted, bytes. */
  maxBytes?: number;
}

export function startFakeSmtp(opts: FakeSmtpOptions): Promise<FakeSmtp> {
  const dbs = new Map<string, OpenDb>();
  const dbFor = () => {
    const file = typeof opts.database === 'function' ? opts.database() : opts.database;
    if (!file) throw new Error('the fake mail server has no database yet');
    if (!dbs.has(file)) dbs.set(file, openDatabase(file));
    return dbs.get(file)!;
  };
  let stored = 0;

  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    size: opts.maxBytes ?? 5 * 1024 * 1024,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('error', callback);
      stream.on('end', async () => {
        try {
          const bytes = Buffer.concat(chunks);
          const raw = bytes.toString('utf8');
          const parsed = await readMail(bytes);
          const from = session.envelope.mailFrom ? session.envelope.mailFrom.address : parsed.fromAddress;
          const db = dbFor();
          for (const rcpt of session.envelope.rcptTo) {
            storeMail(db, {
              teamId: parsed.teamId,
              fromAddress: from.toLowerCase(),
              toAddress: rcpt.address.toLowerCase(),
              subject: parsed.subject,
              text: parsed.text,
              html: parsed.html,
              raw,
            });
            stored++;
          }
          callback();
        } catch (err) {
          callback(err as Error);
        }
      });
    },
  });

  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port, opts.host ?? '127.0.0.1', () => {
      server.off('error', reject);
      server.on('error', (err) => console.error('[fake-smtp]', err.message));
      resolve({
        port: opts.port,
        count: () => stored,
        close: () =>
          new Promise<void>((done) =>
            server.close(() => {
              for (const db of dbs.values()) db.$client.close();
              done();
            }),
          ),
      });
    });
  });
}
