import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MeasuredMargins } from '@/lib/handoff/bench-compare';
import type { BenchPoints } from '@/lib/handoff/bench-parse';
import type { BenchDetailBody, BenchSummaryRow, BenchUploadedBody } from '@/lib/handoff/bench-responses';
import type { Jsonified } from '@/lib/json';
import type { BenchShiftedBody } from '@/lib/response-bodies';
import { designKeys } from './revisions';
import { requestJson, sendJson } from './request';

/**
 * Bench data on the client: query options with stable keys, the upload, and a hook that
 * gives Tune (and any Bode plot) the newest bench data of a design as an overlay
 * `{ f, gainDb, phaseDeg, name }` (points as displayed: shift applied, phase on the branch of T).
 */
export const benchKeys = {
  /** Every list of the design (a prefix: invalidating it refreshes the per-revision lists too). */
  all: (designId: number) => [...designKeys.detail(designId), 'bench'] as const,
  list: (designId: number, revision: number | null = null) => [...designKeys.detail(designId), 'bench', 'list', revision ?? 'all'] as const,
  detail: (designId: number, benchId: number, revision: number | null) =>
    [...designKeys.detail(designId), 'bench', benchId, revision ?? 'none'] as const,
};

export type { BenchPoints, MeasuredMargins };

export type BenchListItem = Jsonified<BenchSummaryRow>;
export type BenchDetail = Jsonified<BenchDetailBody>;
export type BenchUploaded = Jsonified<BenchUploadedBody> & { revision: number };

/** The overlay a Bode plot takes (components/plot/bode-plot.tsx `bench`). */
export interface BenchOverlay extends BenchPoints {
  name?: string;
}

/** Bench data of a design, or with `revision` only that revision's (and design-wide data). */
export const benchListQueryOptions = (designId: number, revision: number | null = null) =>
  queryOptions({
    queryKey: benchKeys.list(designId, revision),
    queryFn: () => requestJson<{ benchData: BenchListItem[] }>(`/api/designs/${designId}/bench${revision ? `?revision=${revision}` : ''}`),
  });

export const benchDetailQueryOptions = (designId: number, benchId: number, revision: number | null = null) =>
  queryOptions({
    queryKey: benchKeys.detail(designId, benchId, revision),
    queryFn: () =>
      requestJson<BenchDetail>(`/api/designs/${designId}/bench/${benchId}${revision ? `?revision=${revision}` : ''}`),
  });

/** Upload a file (multipart); throws ApiError whose body names the line of a bad file. */
export function uploadBenchData(designId: number, file: File, opts: { name?: string; frequencyUnit?: string; phaseShifted?: boolean; revision?: number } = {}) {
  const form = new FormData();
  form.set('file', file);
  if (opts.revision) form.set('revision', String(opts.revision));
  if (opts.name) form.set('name', opts.name);
  if (opts.frequencyUnit) form.set('frequencyUnit', opts.frequencyUnit);
  if (opts.phaseShifted) form.set('phaseShifted', 'true');
  return requestJson<BenchUploaded>(`/api/designs/${designId}/bench`, { method: 'POST', body: form });
}

export const setBenchPhaseShift = (designId: number, benchId: number, phaseShifted: boolean) =>
  sendJson<Jsonified<BenchShiftedBody>>(`/api/designs/${designId}/bench/${benchId}`, 'PATCH', { phaseShifted });

export const deleteBenchData = (designId: number, benchId: number) => sendJson<unknown>(`/api/designs/${designId}/bench/${benchId}`, 'DELETE');

/**
 * The newest bench data of a design (with `revision`: of that revision) as a plot overlay, or
 * null when there is none.
 * Tune: `const bench = useBenchOverlay(designId, shownRevision); <BodePlot bench={bench ?? undefined} … />`.
 */
export function useBenchOverlay(designId: number, revision: number | null = null): BenchOverlay | null {
  const list = useQuery(benchListQueryOptions(designId, revision));
  const newest = list.data?.benchData[0];
  const detail = useQuery({ ...benchDetailQueryOptions(designId, newest?.id ?? 0), enabled: newest !== undefined });
  if (!newest || !detail.data) return null;
  return { ...detail.data.points, name: `Bench: ${detail.data.name}` };
}
