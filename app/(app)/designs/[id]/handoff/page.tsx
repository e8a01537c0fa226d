import { formatIsoDay } from '@/lib/format';
import type { Metadata } from 'next';
import Link from 'next/link';
import { getLatestRevision, getRevision, getSignoffState, listRevisionPage, revisionPageOf } from '@/db/queries';
import { briefPage } from '@/lib/queries/revisions';
import { RevisionPicker } from '@/components/tune/revision-picker';
import { can } from '@/lib/auth';
import { loadDesignPage } from '@/lib/design-page';
import { analyze } from '@/lib/engine/analyze';
import { buildPartsList, DEFAULT_DESIGNATOR, duplicateDesignators, PART_NAME, TOLERANCE_CONVENTION } from '@/lib/handoff/parts-list';
import { spiceNetlistFile } from '@/lib/handoff/spice';
import { CautionsPanel } from '@/components/cautions-panel';
import { SignoffBadge } from '@/components/designs/signoff-badge';
import { BenchPanel } from '@/components/bench/bench-panel';
import { DesignatorEditor } from '@/components/handoff/designator-editor';
import { ExportButtons } from '@/components/handoff/export-buttons';
import { ImportDesign } from '@/components/handoff/import-design';
import { NetlistView } from '@/components/handoff/netlist-view';
import { PartsPreview } from '@/components/handoff/parts-preview';

export const metadata: Metadata = { title: 'Handoff' };

type Props = { params: Promise<{ id: string }>; searchParams: Promise<{ r?: string }> };

// Handoff: what leaves Phasewright for the schematic and the bench, per revision (?r=N, default latest).
export default async function HandoffPage({ params, searchParams }: Props) {
  const [{ id }, { r }] = await Promise.all([params, searchParams]);
  const { user, db, design } = await loadDesignPage(id);
  const canEdit = can.editDesigns(user.role);
  const latest = getLatestRevision(db, design.id);

  if (!latest)
    return (
      <div className="space-y-4">
        <div className="card p-8 text-center text-slate-600">
          Nothing to hand off yet. Shape the loop on{' '}
          <Link href={`/designs/${design.id}`} className="text-indigo-700 underline">
            Tune
          </Link>{' '}
          and save a revision; its parts list, netlist and report appear here.
        </div>
        {canEdit && <ImportDesign />}
      </div>
    );

  const revision = (r && /^\d{1,9}$/.test(r) ? getRevision(db, design.id, Number(r)) : undefined) ?? latest;
  // One page of revision links (the one holding the revision shown); the picker pages through the rest.
  const revisionPage = briefPage(listRevisionPage(db, design.id, revisionPageOf(latest.number, revision.number)));
  const input = revision.input;
  const result = analyze(input);
  const rows = buildPartsList(result.parts, input.compensator.type, design.designatorMap, input.compensator.amplifier);
  const netlist = spiceNetlistFile({ designName: design.name, revision: revision.number, input, parts: result.parts });
  const state = getSignoffState(db, revision.id);

  return (
    <div className="space-y-5" data-testid="handoff">
      <CautionsPanel />

      <section className="card flex flex-wrap items-center gap-x-6 gap-y-3 p-4">
        <RevisionPicker key={revision.number} designId={design.id} shown={revision.number} initial={revisionPage} path={`/designs/${design.id}/handoff`} label="Revision to hand off" />
        <div className="text-sm text-slate-600">
          <SignoffBadge state={state} /> <span className="ml-2">saved {formatIsoDay(revision.createdAt)} by {revision.authorName}</span>
          {revision.note && <span className="ml-2 italic">“{revision.note}”</span>}
        </div>
        <ExportButtons designId={design.id} revision={revision.number} />
      </section>

      <div className="grid gap-5 xl:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <section className="card p-4" aria-labelledby="parts-heading">
          <h2 id="parts-heading" className="text-lg font-semibold">
            Parts list <span className="text-sm font-normal text-slate-500">r{revision.number}</span>
          </h2>
          <p className="mb-3 text-xs text-slate-500">{TOLERANCE_CONVENTION}</p>
          <PartsPreview rows={rows} duplicates={duplicateDesignators(rows)} />
        </section>
        <section className="card p-4" aria-labelledby="designators-heading">
          <h2 id="designators-heading" className="text-lg font-semibold">
            Reference designators
          </h2>
          <p className="mb-3 text-sm text-slate-600">
            Name each part as on your schematic; the mapping is kept with the design and used by every export.
          </p>
          <DesignatorEditor
            designId={design.id}
            parts={rows.map((x) => ({ part: x.part, label: PART_NAME[x.part], current: design.designatorMap[x.part] ?? '', defaultDesignator: DEFAULT_DESIGNATOR[x.part] }))}
            canEdit={canEdit}
          />
        </section>
      </div>

      <BenchPanel designId={design.id} revision={revision.number} canEdit={canEdit} />

      <section className="card p-4" aria-labelledby="netlist-heading">
        <h2 id="netlist-heading" className="text-lg font-semibold">
          SPICE netlist
        </h2>
        <p className="mb-3 text-sm text-slate-600">
          Averaged power stage at the operating point, the op-amp compensator with the parts list&apos;s standard values (what will be built; the
          ideal values are in the comments) and an <code>.ac</code> sweep. Runs as it is:{' '}
          <code className="rounded bg-slate-100 px-1">ngspice -b file.cir</code> prints the duty, then frequency, loop gain in dB and phase.
        </p>
        <NetlistView text={netlist} />
      </section>

      {canEdit && <ImportDesign />}
    </div>
  );
}
