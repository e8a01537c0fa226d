import { notFound } from 'next/navigation';
import { getDb } from '@/db/client';
import { getDesign, getLatestRevision, getRevision, listRevisionPage, revisionPageOf } from '@/db/queries';
import { can, requireUser } from '@/lib/auth';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import type { AnalyzeRequest, Topology } from '@/lib/engine/types';
import { CautionsPanel } from '@/components/cautions-panel';
import { preloadPlotly } from '@/components/plot/preload-plotly';
import { TuneScreen, type TuneMode } from '@/components/tune/tune-screen';
import { briefPage } from '@/lib/queries/revisions';

/** A new design starts from the engine's sample of its topology. */
function startingInput(topology: Topology): AnalyzeRequest {
  const sample = SAMPLE_DESIGNS.find((s) => s.request.converter.topology === topology) ?? SAMPLE_DESIGNS[0];
  return structuredClone(sample.request);
}

const revisionParam = (v: string | undefined) => (v !== undefined && v !== '' ? (/^\d+$/.test(v) ? Number(v) : NaN) : null);

// Tune: the latest revision (editable for designers and admins), or ?r=N read-only.
// ?from=N (designers and admins): the latest revision with rN's input loaded as unsaved changes.
export default async function TunePage({ params, searchParams }: { params: Promise<{ id: string }>; searchParams: Promise<{ r?: string; from?: string }> }) {
  preloadPlotly(); // fetched while the page hydrates, evaluated after Tune's SVG first picture
  const [{ id }, q] = await Promise.all([params, searchParams]);
  const user = await requireUser();
  const db = getDb();
  const design = /^\d+$/.test(id) ? getDesign(db, user.teamId, Number(id)) : undefined;
  if (!design) notFound();
  const latest = getLatestRevision(db, design.id);
  const r = revisionParam(q.r);
  const requested = r !== null ? (Number.isNaN(r) ? undefined : getRevision(db, design.id, r)) : latest;
  if (r !== null && !requested) notFound();
  const shown = requested ?? null;
  const canEdit = can.editDesigns(user.role);
  const mode: TuneMode = !canEdit ? 'role-read-only' : shown && latest && shown.number !== latest.number ? 'earlier-revision' : 'edit';
  const fromNumber = r === null && mode === 'edit' && latest ? revisionParam(q.from) : null;
  const from = fromNumber !== null ? (Number.isNaN(fromNumber) ? undefined : getRevision(db, design.id, fromNumber)) : null;
  if (from === undefined) notFound();
  // Only the page of revisions holding the one shown (100, newest first); the picker pages through the rest.
  const revisions = briefPage(listRevisionPage(db, design.id, latest && shown ? revisionPageOf(latest.number, shown.number) : 1));
  const shownInput = shown ? shown.input : startingInput(design.topology);
  return (
    <div className="space-y-4">
      <CautionsPanel />
      <TuneScreen
        // ?from=N and the latest share a key: after a save the address drops ?from without a remount.
        key={r !== null ? `r${r}` : 'latest'}
        designId={design.id}
        initialInput={from ? from.input : shownInput}
        savedInput={shownInput}
        editFrom={from && from.number !== shown?.number ? from.number : null}
        shownRevision={shown?.number ?? null}
        latestRevision={latest?.number ?? null}
        mode={mode}
        role={user.role}
        revisions={revisions}
      />
    </div>
  );
}
