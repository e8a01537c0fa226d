/**
 * The demo mailbox page shows the signed-in member their own mail about their
 * current team, and nobody else's: not another member's, not another team's
 * (it used to list every team's mail to an admin of any team).
 */
import { eq } from 'drizzle-orm';
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { openDatabase } from '@/db/connection';
import { storeMail } from '@/db/queries';
import { teams } from '@/db/schema';
import { signedInAs, type Client } from '../support/http';
import { otherTeam } from '../support/other-team';

const baseUrl = inject('baseUrl');
const dbPath = inject('dbPath');
const tag = `mbx-${Date.now()}`;
let admin: Client;
let reviewer: Client;

beforeAll(async () => {
  admin = await signedInAs(baseUrl, 'admin');
  reviewer = await signedInAs(baseUrl, 'reviewer');
  const outsider = await otherTeam(baseUrl, dbPath);
  const db = openDatabase(dbPath);
  try {
    const demo = db.select().from(teams).where(eq(teams.slug, 'northwind-power')).get()!;
    const mail = (to: string, teamId: number, subject: string) =>
      storeMail(db, { teamId, fromAddress: 'noreply@phasewright.local', toAddress: to, subject: `${tag} ${subject}`, text: subject, html: '', raw: '' });
    mail('admin@demo.test', demo.id, 'for the admin');
    mail('reviewer@demo.test', demo.id, 'for the reviewer');
    mail('admin@demo.test', outsider.teamId, 'about another team');
    mail('outsider@harbor.test', outsider.teamId, 'for the outsider');
  } finally {
    db.$client.close();
  }
});

async function page(c: Client) {
  const res = await c.fetch('/mailbox');
  return { status: res.status, html: await res.text() };
}

describe('demo mailbox', () => {
  it("an admin sees their own mail about the current team, not other members' or other teams'", async () => {
    const { status, html } = await page(admin);
    expect(status).toBe(200);
    expect(html).toContain(`${tag} for the admin`);
    expect(html).not.toContain(`${tag} for the reviewer`);
    expect(html).not.toContain(`${tag} about another team`);
    expect(html).not.toContain(`${tag} for the outsider`);
  });

  it('every signed-in member has the page, showing only their own mail', async () => {
    const { status, html } = await page(reviewer);
    expect(status).toBe(200);
    expect(html).toContain(`${tag} for the reviewer`);
    expect(html).not.toContain(`${tag} for the admin`);
  });

  it("opening another member's message by id shows nothing of it", async () => {
    const db = openDatabase(dbPath);
    const all = db.$client.prepare('SELECT id, subject FROM mailbox WHERE subject LIKE ?').all(`${tag}%`) as { id: number; subject: string }[];
    db.$client.close();
    const theirs = all.find((m) => m.subject.endsWith('for the outsider'))!;
    const html = await (await reviewer.fetch(`/mailbox?m=${theirs.id}`)).text();
    expect(html).not.toContain(`${tag} for the outsider`);
  });
});
