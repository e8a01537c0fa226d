import { and, desc, eq, isNull, or } from 'drizzle-orm';
import type { Db } from '../connection';
import type { BenchPoints } from '../../lib/handoff/bench-parse';
import { benchData, designs, revisions, users } from '../schema';
import { writeAudit } from './audit';
import { touchDesign } from './designs';

/**
 * Bench data of a design: measured loop responses, stored as uploaded (points rising in
 * frequency, Hz / dB / degrees). `phaseShifted` marks data measured as −T that is shown
 * with 180° taken off; the stored points are never rewritten. Every function is scoped by
 * team through the design. Bench data belongs to the revision measured (`revisionId`); data
 * from before that rule whose design had no revision then has none and is shown design-wide.
 */


const summaryColumns = {
  id: benchData.id,
  designId: benchData.designId,
  revisionId: benchData.revisionId,
  revisionNumber: revisions.number,
  name: benchData.name,
  phaseShifted: benchData.phaseShifted,
  uploadedBy: benchData.uploadedBy,
  uploaderName: users.name,
  createdAt: benchData.createdAt,
};

/**
 * Bench data of a design, newest first, without the points. With `revisionNumber`, only that
 * revision's (and design-wide data, which belongs to every revision).
 */
export function listBenchData(db: Db, teamId: number, designId: number, opts: { revisionNumber?: number } = {}) {
  const scope = and(eq(benchData.designId, designId), eq(designs.teamId, teamId));
  return db
    .select(summaryColumns)
    .from(benchData)
    .innerJoin(designs, eq(designs.id, benchData.designId))
    .innerJoin(users, eq(users.id, benchData.uploadedBy))
    .leftJoin(revisions, eq(revisions.id, benchData.revisionId))
    .where(opts.revisionNumber === undefined ? scope : and(scope, or(eq(revisions.number, opts.revisionNumber), isNull(benchData.revisionId))))
    .orderBy(desc(benchData.id))
    .all();
}

/** One bench data set with its points, or undefined outside the team or design. */
export function getBenchData(db: Db, teamId: number, designId: number, benchId: number) {
  const row = db
    .select({ ...summaryColumns, points: benchData.points })
    .from(benchData)
    .innerJoin(designs, eq(designs.id, benchData.designId))
    .innerJoin(users, eq(users.id, benchData.uploadedBy))
    .leftJoin(revisions, eq(revisions.id, benchData.revisionId))
    .where(and(eq(benchData.id, benchId), eq(benchData.designId, designId), eq(designs.teamId, teamId)))
    .get();
  return row;
}

export function createBenchData(
  db: Db,
  b: { teamId: number; designId: number; revisionId: number; name: string; points: BenchPoints; phaseShifted: boolean; uploadedBy: number },
) {
  return db.transaction((tx) => {
    const row = tx
      .insert(benchData)
      .values({ designId: b.designId, revisionId: b.revisionId, name: b.name, points: b.points, phaseShifted: b.phaseShifted, uploadedBy: b.uploadedBy })
      .returning({ id: benchData.id })
      .get();
    touchDesign(tx, b.designId);
    writeAudit(tx, {
      teamId: b.teamId,
      userId: b.uploadedBy,
      action: 'bench.uploaded',
      entityType: 'bench_data',
      entityId: row.id,
      detail: { designId: b.designId, revisionId: b.revisionId, name: b.name, points: b.points.f.length },
    });
    return row.id;
  });
}

/** Set or clear the 180° shift; false when there is no such bench data in the team. */
export function setBenchPhaseShift(db: Db, actorId: number, teamId: number, designId: number, benchId: number, shifted: boolean) {
  if (!getBenchData(db, teamId, designId, benchId)) return false;
  db.update(benchData).set({ phaseShifted: shifted }).where(eq(benchData.id, benchId)).run();
  writeAudit(db, { teamId, userId: actorId, action: 'bench.phase-shift', entityType: 'bench_data', entityId: benchId, detail: { shifted } });
  return true;
}

/** Delete one bench data set; false when there is no such bench data in the team. */
export function deleteBenchData(db: Db, actorId: number, teamId: number, designId: number, benchId: number) {
  if (!getBenchData(db, teamId, designId, benchId)) return false;
  db.delete(benchData).where(eq(benchData.id, benchId)).run();
  writeAudit(db, { teamId, userId: actorId, action: 'bench.deleted', entityType: 'bench_data', entityId: benchId, detail: { designId } });
  return true;
}
