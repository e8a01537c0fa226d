/**
 * Remarks on a revision and on Compare: stored with the revision (and the other revision of the
 * comparison), mailed to the revision's author and its reviewer, never to the writer.
 */
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { openDatabase } from '@/db/connection';
import { listMailTo } from '@/db/queries';
import { Client, signedInAs } from '../support/http';
import { savedDesign, tweak } from '../support/saved-design';

const baseUrl = inject('baseUrl');
const dbPath = inject('dbPath');
const ROLES = ['admin', 'designer', 'reviewer', 'viewer'] as const;
const clients = {} as Record<(typeof ROLES)[number], Client>;
const ids = {} as Record<(typeof ROLES)[number], number>;
let designId: number;

function mailTo(address: string, subject: string) {
  const db = openDatabase(dbPath);
  try {
    return listMailTo(db, address).filter((m) => m.subject === subject);
  } finally {
    db.$client.close();
  }
}

const remarks = (n: number) => `/api/designs/${designId}/revisions/${n}/remarks`;

beforeAll(async () => {
  for (const role of ROLES) {
    clients[role] = await signedInAs(baseUrl, role);
    ids[role] = (await (await clients[role].fetch('/api/auth/session')).json()).user.id;
  }
  const saved = await savedDesign(clients.designer, 'Remark mail rail');
  designId = saved.designId;
  const r2 = await clients.designer.json(`/api/designs/${designId}/revisions`, 'POST', { baseRevision: 1, note: 'more gain', input: tweak(saved.input, 'r1', 0.8) });
  expect(r2.status).toBe(201);
  expect((await clients.designer.json(`/api/designs/${designId}/revisions/2/submit`, 'POST', { reviewerId: ids.reviewer, message: 'see r2' })).status).toBe(201);
});

describe('remark mail', () => {
  it("a reviewer's remark on a revision goes to its author, not back to the reviewer", async () => {
    const res = await clients.reviewer.json(remarks(2), 'POST', { body: 'PM looks thin at low line' });
    expect(res.status).toBe(201);
    expect((await res.json()).mailed).toBe(1);
    await expect.poll(() => mailTo('designer@demo.test', 'Remark on Remark mail rail r2').length).toBe(1);
    const mail = mailTo('designer@demo.test', 'Remark on Remark mail rail r2')[0];
    expect(mail.text).toContain('Rui Reviewer left a remark on Remark mail rail r2.');
    expect(mail.text).toContain('> PM looks thin at low line');
    expect(mail.text).toMatch(/\/designs\/\d+\/history\?r=2/);
    expect(mailTo('reviewer@demo.test', 'Remark on Remark mail rail r2')).toHaveLength(0);
  });

  it("a remark on Compare is kept with the revision and the comparison, and mailed to author and reviewer", async () => {
    const res = await clients.admin.json(remarks(2), 'POST', { body: 'Compared with r1: the zero moved well', comparedWith: 1 });
    expect(res.status).toBe(201);
    expect(await res.json()).toMatchObject({ comparedWith: 1, mailed: 2 });
    for (const to of ['designer@demo.test', 'reviewer@demo.test']) {
      await expect.poll(() => mailTo(to, 'Remark on Remark mail rail r2').some((m) => m.text.includes('while comparing it with r1'))).toBe(true);
      const mail = mailTo(to, 'Remark on Remark mail rail r2').find((m) => m.text.includes('the zero moved well'))!;
      expect(mail.text).toMatch(/\/designs\/\d+\/compare\?a=1&b=2/);
    }
    const list = await (await clients.viewer.fetch(remarks(2))).json(); // newest first
    expect(list.remarks[0]).toMatchObject({ body: 'Compared with r1: the zero moved well', comparedWith: 1, authorName: 'Ada Admin' });
  });

  it('the author remarking on their own draft mails nobody', async () => {
    const res = await clients.designer.json(remarks(1), 'POST', { body: 'note to self' });
    expect(res.status).toBe(201);
    expect((await res.json()).mailed).toBe(0);
  });

  it('comparing with a revision that does not exist is a 422 naming comparedWith; a viewer may not remark (403)', async () => {
    const bad = await clients.reviewer.json(remarks(2), 'POST', { body: 'x', comparedWith: 99 });
    expect(bad.status).toBe(422);
    expect((await bad.json()).issues[0].path).toBe('comparedWith');
    expect((await clients.viewer.json(remarks(2), 'POST', { body: 'x' })).status).toBe(403);
  });
});
