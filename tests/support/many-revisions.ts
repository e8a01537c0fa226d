/**
 * A design with hundreds of revisions, written straight into the test server's database through
 * the query functions (one transaction, not hundreds of HTTP saves): each copies the design's
 * latest revision with the note "bulk rN".
 */
import { openDatabase } from '@/db/connection';
import { eq } from 'drizzle-orm';
import { createRevision, getLatestRevision } from '@/db/queries';
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
