import { and, count, desc, eq } from 'drizzle-orm';
import { pageWindow } from '@/lib/paging';
import type { Db } from '../connection';
import { mailbox } from '../schema';

/** Messages the local fake SMTP server caught (demo and tests only). */

export interface CaughtMail {
  teamId?: number | null;
  fromAddress: string;
  toAddress: string;
  subject: string;
  text: string;
  html: string;
  raw: string;
}

export function storeMail(db: Db, m: CaughtMail) {
  return db.insert(mailbox).values(m).returning().get();
}

/** Newest first. */
export function listMail(db: Db, limit = 100) {
  return db.select().from(mailbox).orderBy(desc(mailbox.id)).limit(limit).all();
}

/** Messages to one address, newest first (addresses compared lower-case). */
export function listMailTo(db: Db, address: string, limit = 50) {
  return db.select().from(mailbox).where(eq(mailbox.toAddress, address.trim().toLowerCase())).orderBy(desc(mailbox.id)).limit(limit).all();
}

/**
 * One page of a user's own mail about one team (the demo mailbox page), newest first: the list's
 * columns only (the open message is read on its own), 100 a page on the index (to, team, id).
 */
export function listMailPageForMember(db: Db, address: string, teamId: number, page: number) {
  const where = and(eq(mailbox.toAddress, address.trim().toLowerCase()), eq(mailbox.teamId, teamId));
  const total = db.select({ n: count() }).from(mailbox).where(where).get()?.n ?? 0;
  const w = pageWindow(total, page);
  const messages = db
    .select({ id: mailbox.id, toAddress: mailbox.toAddress, subject: mailbox.subject, createdAt: mailbox.createdAt })
    .from(mailbox)
    .where(where)
    .orderBy(desc(mailbox.id))
    .limit(w.pageSize)
    .offset(w.offset)
    .all();
  return { messages, total, page: w.page, lastPage: w.lastPage, pageSize: w.pageSize };
}

/** One message, only when it is the user's own mail about that team. */
export function getMailForMember(db: Db, id: number, address: string, teamId: number) {
  return db
    .select()
    .from(mailbox)
    .where(and(eq(mailbox.id, id), eq(mailbox.toAddress, address.trim().toLowerCase()), eq(mailbox.teamId, teamId)))
    .get();
}
