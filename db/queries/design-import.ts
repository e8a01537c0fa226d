import type { Db } from '../connection';
import type { AnalyzeRequest } from '../../lib/engine/types';
import type { RevisionSummary } from '../../lib/revision-summary';
import type { Topology } from './designs';
import { createDesign, updateDesign } from './designs';
import { createRevision } from './revisions';

/**
 * A new design from a design file: the design, then its first revision holding the file's
 * analysis request and the summary computed from it. One transaction: all or nothing.
 */
export function importDesign(
  db: Db,
  actorId: number,
  teamId: number,
  d: {
    name: string;
    description: string;
    topology: Topology;
    designatorMap: Record<string, string>;
    input: AnalyzeRequest;
    summary: RevisionSummary;
    note: string;
  },
) {
  return db.transaction((tx) => {
    const design = createDesign(tx, actorId, teamId, { name: d.name, description: d.description, topology: d.topology });
    if (Object.keys(d.designatorMap).length > 0) updateDesign(tx, actorId, teamId, design.id, { designatorMap: d.designatorMap });
    const revision = createRevision(tx, {
      teamId,
      designId: design.id,
      baseNumber: null,
      input: d.input,
      summary: d.summary,
      authorId: actorId,
      note: d.note,
    });
    return { designId: design.id, revision: revision.number };
  });
}
