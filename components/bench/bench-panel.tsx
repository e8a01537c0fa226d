'use client';

import { formatCount, formatIsoDay } from '@/lib/format';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useMemo, useRef, useState } from 'react';
import { formatSi } from '@/lib/units/si';
import { bodeSvg, differenceSvg } from '@/lib/handoff/svg-plot';
import {
  benchDetailQueryOptions,
  benchKeys,
  benchListQueryOptions,
  deleteBenchData,
  setBenchPhaseShift,
  uploadBenchData,
  type BenchDetail,
  type BenchUploaded,
} from '@/lib/queries/bench';
import { ApiError } from '@/lib/queries/request';
import { Button } from '@/components/ui/button';

const UNITS = [
  { value: '', label: 'Unit from the header (else Hz)' },
  { value: 'Hz', label: 'Frequency in Hz' },
  { value: 'kHz', label: 'Frequency in kHz' },
  { value: 'MHz', label: 'Frequency in MHz' },
];

const hz = (v: number | null | undefined) => (v === null || v === undefined ? '—' : formatSi(v, 'Hz'));
const deg = (v: number | null | undefined) => (v === null || v === undefined ? '—' : `${v.toFixed(1)}°`);
const db = (v: number | null | undefined) => (v === null || v === undefined ? '—' : `${v.toFixed(1)} dB`);

export function BenchPanel({ designId, revision, canEdit }: { designId: number; revision: number; canEdit: boolean }) {
  const qc = useQueryClient();
  const list = useQuery(benchListQueryOptions(designId, revision));
  const [selected, setSelected] = useState<number | null>(null);
  const [unit, setUnit] = useState('');
  const [uploaded, setUploaded] = useState<BenchUploaded | null>(null);
  const [failure, setFailure] = useState<string | null>(null);
  const fileRef = useRef<HTMLInputElement>(null);
  const items = list.data?.benchData ?? [];
  const current = selected ?? items[0]?.id ?? null;
  // Each data set is compared with the model of the revision it was measured on.
  const currentItem = items.find((b) => b.id === current);
  const compareWith = currentItem?.revisionNumber ?? revision;
  const detail = useQuery({ ...benchDetailQueryOptions(designId, current ?? 0, compareWith), enabled: current !== null });

  const invalidate = () => qc.invalidateQueries({ queryKey: benchKeys.all(designId) });

  const upload = useMutation({
    mutationFn: (file: File) => uploadBenchData(designId, file, { frequencyUnit: unit || undefined, revision }),
    onMutate: () => {
      setFailure(null);
      setUploaded(null);
    },
    onSuccess: async (r) => {
      setUploaded(r);
      setSelected(r.id);
      await invalidate();
    },
    onError: (e) => setFailure(e instanceof ApiError ? e.message : 'The upload failed; try again'),
  });

  const shift = useMutation({
    mutationFn: (v: { id: number; on: boolean }) => setBenchPhaseShift(designId, v.id, v.on),
    onSuccess: async () => {
      setUploaded(null);
      await invalidate();
    },
  });

  const remove = useMutation({
    mutationFn: (id: number) => deleteBenchData(designId, id),
    onSuccess: async () => {
      setSelected(null);
      setUploaded(null);
      await invalidate();
    },
  });

  return (
    <section className="card p-4" aria-labelledby="bench-heading" data-testid="bench-panel">
      <div className="flex flex-wrap items-start gap-4">
        <div className="min-w-[16rem] flex-1">
          <h2 id="bench-heading" className="text-lg font-semibold">
            Bench data <span className="text-sm font-normal text-slate-500">measured on r{revision}</span>
          </h2>
          <p className="text-sm text-slate-600">
            The loop gain T measured with a network or frequency-response analyzer: CSV or TSV of frequency, gain (dB) and phase (°), up to
            10 MB or 20,000 rows. The phase is that of T, near −90° at low frequency with an integrating compensator. An upload belongs to r{revision}
            (the board built from it) and is compared with r{revision}&apos;s model; shown on Tune as grey dots.
          </p>
        </div>
        {canEdit && (
          <form
            className="flex flex-wrap items-end gap-2"
            onSubmit={(e) => {
              e.preventDefault();
              const f = fileRef.current?.files?.[0];
              if (f) upload.mutate(f);
            }}
          >
            <label className="block">
              <span className="label">File</span>
              <input ref={fileRef} type="file" name="bench-file" accept=".csv,.tsv,.txt,text/csv,text/plain" className="block text-sm" required />
            </label>
            <label className="block">
              <span className="label">Frequency unit</span>
              <select className="input" value={unit} onChange={(e) => setUnit(e.target.value)}>
                {UNITS.map((u) => (
                  <option key={u.value} value={u.value}>
                    {u.label}
                  </option>
                ))}
              </select>
            </label>
            <Button type="submit" variant="primary" disabled={upload.isPending}>
              {upload.isPending ? 'Reading…' : 'Upload'}
            </Button>
          </form>
        )}
      </div>

      {failure && (
        <p className="mt-3 rounded border border-rose-300 bg-rose-50 px-3 py-2 text-sm text-rose-800" role="alert" data-testid="bench-error">
          {failure}
        </p>
      )}
      {uploaded && (
        <div className="mt-3 rounded border border-emerald-300 bg-emerald-50 px-3 py-2 text-sm text-emerald-900" role="status">
          Stored “{uploaded.name}”: {formatCount(uploaded.rows)} points.
          {uploaded.notes.length > 0 && <span className="text-emerald-800"> {uploaded.notes.join(' ')}</span>}
        </div>
      )}

      {items.length > 0 && (
        <div className="mt-4 flex flex-wrap gap-2" role="list" aria-label="Uploaded bench data">
          {items.map((b) => (
            <div
              key={b.id}
              role="listitem"
              className={`flex items-center gap-2 rounded-md border px-2 py-1 text-sm ${b.id === current ? 'border-indigo-500 bg-indigo-50' : 'border-slate-200 bg-white'}`}
            >
              <button type="button" className="text-left" onClick={() => setSelected(b.id)} aria-pressed={b.id === current}>
                <span className="font-medium">{b.name}</span>{' '}
                <span className="text-xs text-slate-500">
                  {b.revisionNumber ? `r${b.revisionNumber}` : 'design-wide'} · {formatIsoDay(b.createdAt)} · {b.uploaderName}
                  {b.phaseShifted ? ' · shifted 180°' : ''}
                </span>
              </button>
              {canEdit && (
                <button
                  type="button"
                  className="text-xs text-rose-700 hover:underline"
                  onClick={() => {
                    if (confirm(`Delete bench data “${b.name}”?`)) remove.mutate(b.id);
                  }}
                  aria-label={`Delete ${b.name}`}
                >
                  Delete
                </button>
              )}
            </div>
          ))}
        </div>
      )}
      {list.isSuccess && items.length === 0 && <p className="mt-4 text-sm text-slate-500">No bench data uploaded for r{revision} yet.</p>}

      {detail.data && (
        <BenchDetailView
          detail={detail.data}
          canEdit={canEdit}
          shifting={shift.isPending}
          onShift={(on) => shift.mutate({ id: detail.data.id, on })}
        />
      )}
      {detail.isError && <p className="mt-3 text-sm text-rose-700">{detail.error.message}</p>}
    </section>
  );
}

function BenchDetailView({ detail, canEdit, shifting, onShift }: { detail: BenchDetail; canEdit: boolean; shifting: boolean; onShift: (on: boolean) => void }) {
  const overlay = useMemo(() => {
    const m = detail.model?.bode ?? { f: [], magDb: [], phaseDeg: [] };
    return bodeSvg(
      { f: m.f, loop: m },
      {
        id: `bench-${detail.id}`,
        title: `Loop gain: model and bench data “${detail.name}”`,
        loopLabel: `Model r${detail.revision}`,
        bench: detail.points,
        crossoverHz: detail.model?.crossoverHz,
        width: 720,
        panelHeight: 200,
      },
    );
  }, [detail]);
  const diff = useMemo(
    () => {
      if (!detail.difference || detail.difference.f.length === 0) return null;
      // Same frequency span as the overlay beside it.
      const f = [...(detail.model?.bode.f ?? []), ...detail.points.f];
      const fRange: [number, number] = [Math.min(...f), Math.max(...f)];
      return differenceSvg(detail.difference, { id: `diff-${detail.id}`, title: 'Model minus bench data', width: 720, fRange });
    },
    [detail],
  );
  const m = detail.measured;
  const model = detail.model;
  const delta = (a: number | null | undefined, b: number | null | undefined, fmt: (v: number) => string) =>
    a === null || a === undefined || b === null || b === undefined ? '—' : fmt(a - b);

  return (
    <div className="mt-4 space-y-4" data-testid="bench-detail">
      {detail.looksInverted && !detail.phaseShifted && (
        <div className="flex flex-wrap items-center gap-3 rounded border border-amber-300 bg-amber-50 px-3 py-2 text-sm text-amber-900" role="alert">
          <span>
            The phase sits near {detail.lowFrequencyPhaseDeg.toFixed(0)}° at low frequency, where T is near −90°: this looks measured as −T (injection
            or channels inverted).
          </span>
          {canEdit && (
            <Button disabled={shifting} onClick={() => onShift(true)}>
              Shift phase by 180°
            </Button>
          )}
        </div>
      )}
      {detail.phaseShifted && (
        <p className="text-sm text-slate-600">
          Shown with 180° taken off the phase (measured as −T).{' '}
          {canEdit && (
            <Button variant="link" disabled={shifting} onClick={() => onShift(false)}>
              Show as uploaded
            </Button>
          )}
        </p>
      )}

      <table className="table-base max-w-2xl" data-testid="bench-margins">
        <thead>
          <tr>
            <th></th>
            <th className="text-right">Bench data</th>
            <th className="text-right">Model r{detail.revision}</th>
            <th className="text-right">Model − bench</th>
          </tr>
        </thead>
        <tbody className="num">
          <tr>
            <td>Crossover fc</td>
            <td className="text-right font-semibold" data-testid="measured-fc">{hz(m.crossoverHz)}</td>
            <td className="text-right">{hz(model?.crossoverHz)}</td>
            <td className="text-right">{delta(model?.crossoverHz, m.crossoverHz, (v) => formatSi(v, 'Hz'))}</td>
          </tr>
          <tr>
            <td>Phase margin</td>
            <td className="text-right font-semibold" data-testid="measured-pm">
              {deg(m.phaseMarginDeg)}
              {detail.looksInverted && !detail.phaseShifted && (
                <span className="ml-1 text-amber-700" title="The phase looks measured as −T; shift it by 180° for a meaningful margin">
                  ⚠
                </span>
              )}
            </td>
            <td className="text-right">{deg(model?.phaseMarginDeg)}</td>
            <td className="text-right">{delta(model?.phaseMarginDeg, m.phaseMarginDeg, (v) => `${v.toFixed(1)}°`)}</td>
          </tr>
          <tr>
            <td>Gain margin</td>
            <td className="text-right font-semibold">{db(m.gainMarginDb)}</td>
            <td className="text-right">{db(model?.gainMarginDb)}</td>
            <td className="text-right">{delta(model?.gainMarginDb, m.gainMarginDb, (v) => `${v.toFixed(1)} dB`)}</td>
          </tr>
        </tbody>
      </table>
      {m.gainCrossings > 1 && (
        <p className="text-sm text-amber-800">The measured gain crosses 0 dB {m.gainCrossings} times; fc is the highest downward crossing.</p>
      )}
      <div className="grid gap-4 lg:grid-cols-2">
        <SvgFigureBlock svg={overlay} label="Model and bench data" testId="bench-overlay" caption="Model loop gain (indigo) with the bench data as grey dots." />
        {diff ? (
          <SvgFigureBlock
            svg={diff}
            label="Model minus bench data"
            testId="bench-difference"
            caption={`Largest difference inside the model sweep: ${detail.largestGainDifferenceDb?.toFixed(2) ?? '—'} dB, ${detail.largestPhaseDifferenceDeg?.toFixed(1) ?? '—'}°.`}
          />
        ) : (
          <p className="text-sm text-slate-500">No bench point lies inside the model sweep, so there is no difference to show.</p>
        )}
      </div>
    </div>
  );
}

function SvgFigureBlock({ svg, label, testId, caption }: { svg: string; label: string; testId: string; caption: string }) {
  return (
    <div>
      <figure
        className="w-full overflow-hidden rounded border border-slate-200 [&_svg]:h-auto [&_svg]:w-full"
        aria-label={label}
        data-testid={testId}
        dangerouslySetInnerHTML={{ __html: svg }}
      />
      <p className="mt-1 text-xs text-slate-500">{caption}</p>
    </div>
  );
}
