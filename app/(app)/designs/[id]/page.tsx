import { notFound } from 'next/navigation';
import { getDb } from '@/db/client';
import { getDesign, getLatestRevision, getRevision, listRevisions } from '@/db/queries';
import { can, requireUser } from '@/lib/auth';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import type { AnalyzeRequest, Topology } from '@/lib/engine/types';
import { CautionsPanel } from '@/components/cautions-panel';
import { TuneScreen, type TuneMode } from '@/components/tune/tune-screen';

/** A new design starts from the engine's sample of its topology. */
function startingInput(topology: Topology): AnalyzeRequest {
  const sample = SAMPLE_DESIGNS.find((s) => s.request.converter.topology === topology) ?? SAMPLE_DESIGNS[0];
  return structuredClone(sample.request);
}

// Tune: the latest revision (editable for designers and admins), or ?r=N read-only.
export default async function TunePage({ params, searchParams }: { params: Promise<{ id: string }>; searchParams: Promise<{ r?: string }> }) {
  const [{ id }, { r }] = await Promise.all([params, searchParams]);
  const user = await requireUser();
  const db = getDb();
  const design = /^\d+$/.test(id) ? getDesign(db, user.teamId, Number(id)) : undefined;
  if (!design) notFound();
  const latest = getLatestRevision(db, design.id);
  const requested = r !== undefined && r !== '' ? (/^\d+$/.test(r) ? getRevision(db, design.id, Number(r)) : undefined) : latest;
  if (r !== undefined && r !== '' && !requested) notFound();
  const shown = requested ?? null;
  const mode: TuneMode = !can.editDesigns(user.role) ? 'role-read-only' : shown && latest && shown.number !== latest.number ? 'earlier-revision' : 'edit';
  const revisions = listRevisions(db, design.id).map((x) => ({
    number: x.number,
    note: x.note,
    authorName: x.authorName,
    createdAt: new Date(x.createdAt).toISOString(),
  }));
  return (
    <div className="space-y-4">
      <CautionsPanel />
      <TuneScreen
        key={r ?? 'latest'}
        designId={design.id}
        initialInput={shown ? (shown.input as AnalyzeRequest) : startingInput(design.topology)}
        shownRevision={shown?.number ?? null}
        latestRevision={latest?.number ?? null}
        mode={mode}
        role={user.role}
        revisions={revisions}
      />
    </div>
  );
}
