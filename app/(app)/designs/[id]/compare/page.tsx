import type { Metadata } from 'next';
import Link from 'next/link';
import { getLatestRevision, getRevision, getSignoffState, listRemarksPage, listRevisionPage, revisionPageOf } from '@/db/queries';
import { PAGE_SIZE, pageParam } from '@/lib/paging';
import { briefPage } from '@/lib/queries/revisions';
import { can } from '@/lib/auth';
import { loadDesignPage } from '@/lib/design-page';
import { analyze } from '@/lib/engine/analyze';
import type { AnalyzeRequest } from '@/lib/engine/types';
import { diffRevisions, marginDeltas, type RevisionSide } from '@/lib/revision-diff';
import type { RevisionSummary } from '@/lib/revision-summary';
import { SignoffBadge } from '@/components/designs/signoff-badge';
import { ComparePicker } from '@/components/review/compare-picker';
import { CompareRemarks } from '@/components/review/compare-remarks';
import { ComparePlot, type CompareLoop } from '@/components/review/compare-plot';
import { DiffTable } from '@/components/review/diff-table';
import { formatDateTime } from '@/lib/format';
import { MarginDeltas } from '@/components/review/margin-deltas';
import { StepCompare } from '@/components/time-domain/step-compare';
import { describeStep, stepOf, stepResponseOf } from '@/lib/step-summary';
import { RangeCompare } from '@/components/range/range-compare';
import { preloadPlotly } from '@/components/plot/preload-plotly';
import { summarizeRange } from '@/lib/range-summary';

export const metadata: Metadata = { title: 'Compare' };

type Props = { params: Promise<{ id: string }>; searchParams: Promise<{ a?: string; b?: string; remarksA?: string; remarksB?: string }> };

/** The loop of a stored revision, recomputed from its saved input (the stored summary keeps no Bode arrays). */
function loopOf(label: string, input: AnalyzeRequest, summary: RevisionSummary): CompareLoop | null {
  try {
    return { label, bode: analyze(input).bode, margins: summary.margins };
  } catch {
    return null;
  }
}

export default async function ComparePage({ params, searchParams }: Props) {
  preloadPlotly();
  const [{ id }, q] = await Promise.all([params, searchParams]);
  const { user, db, design } = await loadDesignPage(id);

  // Only the two revisions compared and a page of numbers for each picker are read, whatever the design's length.
  const latest = getLatestRevision(db, design.id);
  if (!latest || latest.number < 2)
    return (
      <div className="card p-8 text-center text-slate-600">
        Compare needs two revisions; this design has {latest ? 'one' : 'none'} so far. Each save on{' '}
        <Link href={`/designs/${design.id}`} className="text-indigo-700 underline">
          Tune
        </Link>{' '}
        adds one.
      </div>
    );

  const revisionOf = (v: string | undefined) => (v !== undefined && /^\d{1,9}$/.test(v) ? getRevision(db, design.id, Number(v)) : undefined);
  const askedA = revisionOf(q.a);
  const askedB = revisionOf(q.b);
  const b = askedB ?? latest;
  const fallbackA = b.baseNumber ?? (b.number > 1 ? b.number - 1 : latest.number);
  const a = askedA ?? getRevision(db, design.id, fallbackA) ?? latest;
  const missing = [q.a && !askedA ? `r${q.a}` : null, q.b && !askedB ? `r${q.b}` : null].filter(Boolean);
  const pickerPage = (n: number) => briefPage(listRevisionPage(db, design.id, revisionPageOf(latest.number, n)));
  const pageA = pickerPage(a.number);
  const pageB = revisionPageOf(latest.number, a.number) === revisionPageOf(latest.number, b.number) ? pageA : pickerPage(b.number);

  const side = (r: typeof a): RevisionSide => ({ input: r.input, summary: r.summary });
  const labelA = `r${a.number}`;
  const labelB = `r${b.number}`;
  const rows = diffRevisions(side(a), side(b));
  const deltas = marginDeltas(side(a), side(b));
  const loopA = loopOf(labelA, side(a).input, side(a).summary);
  const loopB = loopOf(labelB, side(b).input, side(b).summary);
  const states = new Map([a, b].map((r) => [r.number, getSignoffState(db, r.id)]));
  // Both revisions answer the same step: B's own (or A's, or half to full load).
  const step = side(b).input.step ?? stepOf(side(a).input);
  const stepA = stepResponseOf(labelA, side(a).input, step);
  const stepB = stepResponseOf(labelB, side(b).input, step);
  // Each side's remarks, newest first, 100 a page (the page in ?remarksA= / ?remarksB=); the list pages on through the API.
  const remarkPage = (r: typeof a, page: string | undefined) => {
    const p = listRemarksPage(db, r.id, pageParam(page));
    return { ...p, pageSize: PAGE_SIZE, remarks: p.remarks.map((m) => ({ ...m, createdAt: m.createdAt.toISOString() })) };
  };
  const remarksA = remarkPage(a, q.remarksA);
  const remarksB = a.number === b.number ? remarksA : remarkPage(b, q.remarksB);
  // Worst case across each revision's own operating range (corners and a fixed-seed spread).
  const rangeA = summarizeRange(side(a).input);
  const rangeB = summarizeRange(side(b).input);

  return (
    <div className="space-y-4" data-testid="compare">
      <div className="flex flex-wrap items-center gap-4">
        <ComparePicker designId={design.id} a={a.number} b={b.number} pageA={pageA} pageB={pageB} />
        <Link href={`/designs/${design.id}/history?r=${b.number}`} className="ml-auto text-sm text-indigo-700 hover:underline">
          Sign-off of {labelB} →
        </Link>
      </div>
      {missing.length > 0 && (
        <p role="status" className="rounded-md bg-amber-50 px-3 py-2 text-sm text-amber-900">
          {missing.join(' and ')} does not exist in this design; showing {labelA} and {labelB} instead.
        </p>
      )}
      {a.number === b.number && (
        <p role="status" className="rounded-md bg-slate-50 px-3 py-2 text-sm text-slate-600">
          A and B are the same revision; pick another one to see changes.
        </p>
      )}

      <div className="grid gap-3 md:grid-cols-2">
        {[
          { tag: 'A', r: a },
          { tag: 'B', r: b },
        ].map(({ tag, r }) => (
          <div key={tag} className="card px-4 py-3 text-sm" data-testid={`side-${tag.toLowerCase()}`}>
            <div className="flex items-center gap-2">
              <span className="font-semibold">
                {tag} · r{r.number}
              </span>
              <SignoffBadge state={states.get(r.number) ?? 'draft'} />
              <span className="ml-auto text-xs text-slate-500">
                {r.authorName} · {formatDateTime(r.createdAt)}
              </span>
            </div>
            <p className="mt-1 text-slate-700">{r.note || <span className="text-slate-400">No note</span>}</p>
          </div>
        ))}
      </div>

      <MarginDeltas deltas={deltas} labelA={labelA} labelB={labelB} />

      <RangeCompare a={rangeA} b={rangeB} labelA={labelA} labelB={labelB} />

      {loopA && loopB ? (
        <ComparePlot a={loopA} b={loopB} />
      ) : (
        <p className="card p-4 text-sm text-rose-700">The loop of {loopA ? labelB : labelA} could not be computed from its saved input.</p>
      )}

      {stepA && stepB && <StepCompare a={stepA} b={stepB} title={describeStep(step)} />}
      <CompareRemarks designId={design.id} a={a.number} b={b.number} remarksA={remarksA} remarksB={remarksB} canRemark={can.remark(user.role)} />

      <DiffTable rows={rows} labelA={labelA} labelB={labelB} />
    </div>
  );
}
