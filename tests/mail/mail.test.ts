/**
 * The mail path end to end without the app: nodemailer (lib/mail.ts) sends
 * over SMTP to the fake mail server (lib/fake-smtp.ts), which keeps each
 * message in the mailbox table; the notifications read back as sent.
 */
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { listMail, listMailTo } from '@/db/queries';
import { mailbox } from '@/db/schema';
import { startFakeSmtp, type FakeSmtp } from '@/lib/fake-smtp';
import { renderMail, sendMail } from '@/lib/mail';
import { notifyAddedToTeam, notifyDecision, notifyReviewRequested } from '@/lib/notify';
import { freePort } from '../support/app-server';
import { tempDb } from '../support/temp-db';

const { db, file, cleanup } = tempDb();
let smtp: FakeSmtp;
const saved = { port: process.env.SMTP_PORT, url: process.env.NEXTAUTH_URL };

beforeAll(async () => {
  const port = await freePort();
  smtp = await startFakeSmtp({ port, database: file });
  process.env.SMTP_PORT = String(port);
  process.env.NEXTAUTH_URL = 'http://phasewright.example.test/';
});
afterAll(async () => {
  await smtp.close();
  cleanup();
  process.env.SMTP_PORT = saved.port;
  process.env.NEXTAUTH_URL = saved.url;
});
beforeEach(() => {
  db.delete(mailbox).run();
});

const revision = { designId: 7, designName: '3V3 rail, sensor board', number: 4 };

describe('renderMail', () => {
  it('writes plain text and escaped HTML with the link in both', () => {
    const { text, html } = renderMail({
      to: 'x@example.test',
      subject: 's',
      paragraphs: ['Hello <Sam> & co'],
      quote: 'line one\nline two',
      link: { label: 'Open r4', url: 'http://h/designs/7/history?r=4&x=1' },
    });
    expect(text).toContain('Hello <Sam> & co');
    expect(text).toContain('> line one\n> line two');
    expect(text).toContain('Open r4: http://h/designs/7/history?r=4&x=1');
    expect(html).toContain('Hello &lt;Sam&gt; &amp; co');
    expect(html).toContain('href="http://h/designs/7/history?r=4&amp;x=1"');
    expect(html).not.toContain('<Sam>');
  });
});

describe('fake mail server', () => {
  it('keeps a message per recipient with subject, text and HTML decoded', async () => {
    const r = await sendMail({ to: 'Kim@Example.test, lee@example.test', subject: 'Ströme — größer als 1 A ✓', paragraphs: ['Grüße, ' + 'x'.repeat(200)] });
    expect(r.sent).toBe(true);
    const rows = listMail(db);
    expect(rows.map((m) => m.toAddress).sort()).toEqual(['kim@example.test', 'lee@example.test']);
    for (const m of rows) {
      expect(m.subject).toBe('Ströme — größer als 1 A ✓');
      expect(m.text).toContain('Grüße, ' + 'x'.repeat(200));
      expect(m.html).toContain('Grüße');
      expect(m.fromAddress).toBe('noreply@phasewright.local');
      expect(m.raw).toMatch(/^Content-Type: multipart\/alternative/im);
    }
  });

  it('answers "not sent" instead of throwing when no server listens', async () => {
    const port = process.env.SMTP_PORT;
    process.env.SMTP_PORT = String(await freePort());
    try {
      const r = await sendMail({ to: 'a@example.test', subject: 'nobody home', paragraphs: ['x'] });
      expect(r.sent).toBe(false);
      expect(r.error).toBeTruthy();
    } finally {
      process.env.SMTP_PORT = port;
    }
  });
});

describe('notifications', () => {
  it('review requested: to the reviewer, quoting the message, linking the revision', async () => {
    await notifyReviewRequested({ to: { email: 'rev@example.test', name: 'Rae' }, by: 'Dev', teamId: 1, revision, message: 'Crossover moved to 40 kHz' });
    const [m] = listMailTo(db, 'rev@example.test');
    expect(m.subject).toBe('Review requested: 3V3 rail, sensor board r4');
    expect(m.text).toContain('Dev asks you to review 3V3 rail, sensor board r4');
    expect(m.text).toContain('> Crossover moved to 40 kHz');
    expect(m.text).toContain('http://phasewright.example.test/designs/7/history?r=4');
    expect(m.html).toContain('href="http://phasewright.example.test/designs/7/history?r=4"');
  });

  it('approved and changes requested', async () => {
    await notifyDecision({ to: { email: 'dev@example.test', name: 'Dev' }, by: 'Rae', teamId: 1, revision, decision: 'approve', message: '' });
    await notifyDecision({ to: { email: 'dev@example.test', name: 'Dev' }, by: 'Rae', teamId: 1, revision, decision: 'request-changes', message: 'PM is thin at low line' });
    const [changes, approved] = listMailTo(db, 'dev@example.test');
    expect(approved.subject).toBe('Approved: 3V3 rail, sensor board r4');
    expect(approved.text).toContain('Rae approved');
    expect(changes.subject).toBe('Changes requested: 3V3 rail, sensor board r4');
    expect(changes.text).toContain('> PM is thin at low line');
    expect(changes.html).toContain('PM is thin at low line');
  });

  it('added to a team', async () => {
    await notifyAddedToTeam({ to: 'new@example.test', name: 'Noor', teamId: 1, teamName: 'Bench crew', role: 'reviewer', by: 'Ada' });
    const [m] = listMailTo(db, 'new@example.test');
    expect(m.subject).toBe('You were added to Bench crew on Phasewright');
    expect(m.text).toContain('Ada added you to the team Bench crew as reviewer');
    expect(m.text).toContain('http://phasewright.example.test/designs');
  });
});
