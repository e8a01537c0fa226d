/**
 * A design with hundreds of revisions, written straight into the test server's database through
 * the query functions (one transaction, not hundreds of HTTP saves): each copies the design's
 * latest revision with the note "bulk rN". `addRemarks` likewise writes remarks "remark i".
 */
import { openDatabase } from '@/db/connection';
import { eq } from 'drizzle-orm';
import { addRemark, createRevision, getLatestRevision, getRevision } from '@/db/queries';
import { designs } from '@/db/schema';

export function addRevisions(dbPath: string, designId: number, count: number): number {
  const db = openDatabase(dbPath);
  try {
    return db.transaction(
      (t) => {
        const design = t.select({ teamId: designs.teamId }).from(designs).where(eq(designs.id, designId)).get();
        let latest = getLatestRevision(t, designId);
        if (!design || !latest) throw new Error(`design ${designId} has no revision to copy`);
        for (let i = 0; i < count; i++) {
          const row = createRevision(t, {
            teamId: design.teamId,
            designId,
            baseNumber: latest.number,
            input: latest.input,
            summary: latest.summary,
            authorId: latest.authorId,
            note: `bulk r${latest.number + 1}`,
          });
          latest = { ...latest, number: row.number };
        }
        return latest.number;
      },
      { behavior: 'immediate' },
    );
  } finally {
    db.$client.close();
  }
}

/** `count` remarks on revision `number` by its author ("remark 1" the oldest). */
export function addRemarks(dbPath: string, designId: number, number: number, count: number) {
  const db = openDatabase(dbPath);
  try {
    db.transaction(
      (t) => {
        const design = t.select({ teamId: designs.teamId }).from(designs).where(eq(designs.id, designId)).get();
        const revision = getRevision(t, designId, number);
        if (!design || !revision) throw new Error(`no r${number} in design ${designId}`);
        for (let i = 1; i <= count; i++)
          addRemark(t, { teamId: design.teamId, designId, revisionId: revision.id, number, authorId: revision.authorId, body: `remark ${i}` });
      },
      { behavior: 'immediate' },
    );
  } finally {
    db.$client.close();
  }
}
