/**
 * The local fake mail server for the demo and the tests: an SMTP listener on
 * 127.0.0.1 that accepts every message and keeps it, one row per envelope
 * recipient, in the `mailbox` table of the app's SQLite database. Nothing is
 * ever relayed. Started by scripts/fake-smtp.ts (demo) and by the test setup.
 */
import { SMTPServer } from 'smtp-server';
import { openDatabase, type OpenDb } from '@/db/connection';
import { storeMail } from '@/db/queries/mailbox';
import { parseMail } from './mime-parse';

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
      stream.on('end', () => {
        try {
          const raw = Buffer.concat(chunks).toString('utf8');
          const parsed = parseMail(raw);
          const from = session.envelope.mailFrom ? session.envelope.mailFrom.address : parsed.from;
          const db = dbFor();
          const teamHeader = Number(parsed.headers.get('x-phasewright-team'));
          const teamId = Number.isInteger(teamHeader) && teamHeader > 0 ? teamHeader : null;
          for (const rcpt of session.envelope.rcptTo) {
            storeMail(db, {
              teamId,
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
