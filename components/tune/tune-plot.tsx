'use client';

import { useCallback, useEffect, useMemo, useState, type ReactNode } from 'react';
import type { Data } from 'plotly.js-dist-min';
import { BodePlot, type BenchOverlay, type BodeSeries, type PlotGeometry, type PlotMarker } from '@/components/plot/bode-plot';
import { around } from '@/components/plot/label-placement';
import { PlotFrame } from '@/components/plot/plot-frame';
import { interpolateLogF } from '@/lib/engine/margins';
import { TRACE_COLORS } from '@/lib/catalog/traces';
import { plantTraceName } from '@/lib/catalog/modes';
import { formatSi } from '@/lib/units/si';
import type { BodeData, Margins, ModulatorSummary, SweepOptions, TransferSummary } from '@/lib/engine/types';
import { HANDLE_SIZE, HandleOverlay, placeHandles, type DragOffset, type HandleMove, type PlacedHandle } from './handle-overlay';
import type { HandleSpec } from './handles';
import { clipBenchToSweep } from './sweep-range';
import { LiveCurves, type LiveCurve } from './live-curves';


type TraceId = 'loop' | 'plant' | 'compensator';
const TRACES: { id: TraceId; name: string }[] = [
  { id: 'loop', name: 'Loop gain T' },
  { id: 'plant', name: plantTraceName('voltage', 'CCM') },
  { id: 'compensator', name: 'Compensator Gc' },
];

interface Props {
  bode: BodeData;
  margins: Margins;
  plant: TransferSummary;
  /** The modulator at the operating point: labels the current-mode double pole at fsw/2. */
  modulator?: ModulatorSummary;
  /** DCM low-frequency pole, Hz (null in CCM). */
  dcmPoleHz?: number | null;
  handles: HandleSpec[];
  /** The sweep the curves were computed on; bench data outside it is not drawn. */
  sweep: SweepOptions;
  /** Widen the sweep to cover the bench data (offered when some of it lies outside). */
  onWidenSweep?: () => void;
  /** The magnitude axis is held while this stays the same (see BodePlot holdRangesKey). */
  holdRangesKey?: string;
  dragging: boolean;
  readOnly: boolean;
  onDragStart: (id: string) => void;
  onDrag: (id: string, offset: DragOffset) => void;
  onDragEnd: (id: string) => void;
  onStep: (id: string, move: HandleMove) => void;
  /** Bench data: the newest measured loop, drawn as grey dots. */
  bench?: BenchOverlay | null;
  /** Corners of the operating range (components/range), drawn under the handles, and their toggle. */
  rangeTraces?: Data[];
  rangeToggle?: ReactNode;
}

const NO_TRACE = { magDb: [], phaseDeg: [] };

const toSeries = (t: (typeof TRACES)[number], trace: { magDb: number[]; phaseDeg: number[] }, shown: Record<TraceId, boolean>): BodeSeries => ({
  id: t.id,
  name: t.name,
  color: TRACE_COLORS[t.id],
  ...trace,
  visible: shown[t.id],
  width: t.id === 'loop' ? 2.5 : 1.75,
});

/** The Tune Bode plot: trace toggles, power-stage features marked, compensator handles on top. */
export function TunePlot({ bode, margins, plant, modulator, dcmPoleHz, handles, sweep, onWidenSweep, holdRangesKey, dragging, readOnly, bench, rangeTraces, rangeToggle, ...events }: Props) {
  const [shown, setShown] = useState<Record<TraceId, boolean>>({ loop: true, plant: true, compensator: true });
  const [benchShown, setBenchShown] = useState(true); // Bench data toggle

  // First picture: until Plotly has loaded and drawn, the frame and every curve are plain SVG
  // (PlotFrame, LiveCurves) laid out on the same geometry, so Plotly takes over without a jump.
  // Plotly is fetched only after that first paint: evaluating it blocks the page for a while.
  const [plotlyDrawn, setPlotlyDrawn] = useState(false);
  const [loadPlotly, setLoadPlotly] = useState(false);
  const svgOnly = !plotlyDrawn;
  useEffect(() => {
    const t = setTimeout(() => setLoadPlotly(true), 3000); // in case the overlay is never painted (hidden tab)
    return () => clearTimeout(t);
  }, []);
  const onFirstPaint = useCallback(() => setLoadPlotly(true), []);
  const onPlotlyDrawn = useCallback(() => {
    if (performance.getEntriesByName(PLOTLY_DRAWN_MARK).length === 0) performance.mark(PLOTLY_DRAWN_MARK);
    setPlotlyDrawn(true);
  }, []);

  // The power stage is named after the plant the loop uses (mode and conduction).
  const plantName = plantTraceName(modulator?.mode ?? 'voltage', dcmPoleHz != null ? 'DCM' : 'CCM');
  const traces = useMemo(() => TRACES.map((t) => (t.id === 'plant' ? { ...t, name: plantName } : t)), [plantName]);
  const all = useMemo(() => traces.map((t) => toSeries(t, bode[t.id], shown)), [traces, bode, shown]);
  // While a handle is dragged Plotly keeps only the power stage, which does not move, and the
  // loop and compensator are drawn live above it (LiveCurves); Plotly takes them back on release.
  const plantOnly = useMemo(() => traces.map((t) => toSeries(t, t.id === 'plant' ? bode.plant : NO_TRACE, shown)), [traces, bode.plant, shown]);
  const series = dragging ? plantOnly : all;
  const live = useMemo<LiveCurve[]>(
    () =>
      dragging || svgOnly
        ? all
            .filter((s) => (svgOnly || s.id !== 'plant') && s.visible)
            .reverse() // the loop on top, as Plotly draws it
            .map((s) => ({ id: s.id, color: s.color, width: s.width ?? 2, magDb: s.magDb, phaseDeg: s.phaseDeg }))
        : [],
    [all, dragging, svgOnly],
  );

  // Handles ride on the compensator curve, or on the loop when the compensator is hidden.
  const handleCurve = shown.compensator ? bode.compensator : bode.loop;
  const placed = useMemo<PlacedHandle[]>(
    () => handles.map((h) => ({ ...h, magDb: interpolateLogF(bode.f, handleCurve.magDb, h.hz) })),
    [handles, bode.f, handleCurve],
  );

  // The labels keep clear of the handles where the overlay draws them (pinned to an edge, stepped
  // apart), with 2 px more for a handle's index digit.
  const obstacles = useCallback(
    (g: PlotGeometry) => [...placeHandles(placed, g).values()].map((p) => around(p.x, p.y, HANDLE_SIZE / 2 + 2)),
    [placed],
  );

  const markerCurve = shown.plant ? bode.plant : bode.loop;
  const markers = useMemo<PlotMarker[]>(() => {
    const at = (hz: number) => interpolateLogF(bode.f, markerCurve.magDb, hz);
    const inRange = (hz: number | null): hz is number => hz !== null && hz >= bode.f[0] && hz <= bode.f[bode.f.length - 1];
    const out: PlotMarker[] = [];
    // In peak current mode the plant's quadratic is the sampling pair at fsw/2 (Ridley), not the LC pair;
    // in DCM the LC pair is gone and one low-frequency pole takes its place.
    const sampling = modulator?.mode === 'peak-current' ? modulator.samplingPoleHz : null;
    if (sampling !== null && sampling !== undefined) {
      const hz = Math.min(sampling, bode.f[bode.f.length - 1]);
      const qp = modulator?.mode === 'peak-current' && modulator.qp !== null ? `, Qp ${modulator.qp.toFixed(2)}` : '';
      out.push({ id: 'fsw2', hz, magDb: at(hz), kind: 'pole', label: `Current-mode double pole fsw/2${qp}`, color: TRACE_COLORS.plant });
    } else if (inRange(plant.resonanceHz))
      out.push({ id: 'lc', hz: plant.resonanceHz, magDb: at(plant.resonanceHz), kind: 'pole', label: 'LC resonance', color: TRACE_COLORS.plant });
    if (inRange(dcmPoleHz ?? null)) out.push({ id: 'dcm', hz: dcmPoleHz!, magDb: at(dcmPoleHz!), kind: 'pole', label: 'DCM pole', color: TRACE_COLORS.plant });
    if (inRange(plant.esrZeroHz))
      out.push({ id: 'esr', hz: plant.esrZeroHz, magDb: at(plant.esrZeroHz), kind: 'zero', label: 'ESR zero', color: TRACE_COLORS.plant });
    if (inRange(plant.rhpZeroHz))
      out.push({ id: 'rhp', hz: plant.rhpZeroHz, magDb: at(plant.rhpZeroHz), kind: 'zero', label: 'RHP zero', color: TRACE_COLORS.rhp });
    return out;
  }, [plant, bode.f, markerCurve, modulator, dcmPoleHz]);

  const marks = useMemo(() => ({ ...margins, color: TRACE_COLORS.loop }), [margins]);
  // Bench points outside the sweep have no model curve beside them: they are not drawn.
  const clipped = useMemo(() => (bench ? clipBenchToSweep(bench, sweep) : null), [bench, sweep]);
  const hiddenBench = clipped ? clipped.below + clipped.above : 0;

  return (
    <div>
      <div className="flex flex-wrap items-center gap-x-4 gap-y-1 px-1 pb-2 text-sm" role="group" aria-label="Traces shown">
        {traces.map((t) => (
          <label key={t.id} className="inline-flex cursor-pointer items-center gap-1.5">
            <input
              type="checkbox"
              className="h-3.5 w-3.5 rounded border-slate-300"
              style={{ accentColor: TRACE_COLORS[t.id] }}
              checked={shown[t.id]}
              onChange={(e) => setShown((s) => ({ ...s, [t.id]: e.target.checked }))}
              data-testid={`toggle-${t.id}`}
            />
            <span className="inline-block h-0.5 w-4 rounded" style={{ background: TRACE_COLORS[t.id] }} aria-hidden />
            <span data-testid={`legend-${t.id}`}>{t.name}</span>
          </label>
        ))}
        {bench && (
          <label className="inline-flex cursor-pointer items-center gap-1.5" title="The newest bench data of this design (Handoff)">
            <input type="checkbox" className="h-3.5 w-3.5 rounded border-slate-300" style={{ accentColor: TRACE_COLORS.bench }} checked={benchShown} onChange={(e) => setBenchShown(e.target.checked)} data-testid="toggle-bench" />
            <span className="inline-block h-1.5 w-1.5 rounded-full bg-trace-bench" aria-hidden />
            {bench.name ?? 'Bench data'}
          </label>
        )}
        {rangeToggle}
        <span className="ml-auto text-xs text-slate-500">
          {readOnly ? 'Handles are fixed (read-only)' : 'Drag ○ zeros and ✕ poles sideways, ◆ gain up or down; arrow keys step a focused handle'}
        </span>
      </div>
      <BodePlot
        f={bode.f}
        series={series}
        markers={markers}
        labelObstacles={obstacles}
        margins={dragging ? undefined : marks}
        bench={clipped?.shown && benchShown ? clipped.shown : undefined}
        holdRangesKey={holdRangesKey}
        extraTraces={dragging ? undefined : rangeTraces}
        freezeRanges={dragging}
        showLegend={false}
        height={480}
        plotly={{ load: loadPlotly, onDrawn: onPlotlyDrawn, placeholder: false }}
        aria-label="Bode plot of the loop gain, power stage and compensator"
        overlay={(g) => (
          <>
            {svgOnly && <PlotFrame geometry={g} />}
            {(dragging || svgOnly) && <LiveCurves geometry={g} f={bode.f} curves={live} margins={margins} color={TRACE_COLORS.loop} />}
            {svgOnly && <AfterFirstPaint onPainted={onFirstPaint} />}
            <HandleOverlay
              geometry={g}
              handles={placed}
              color={TRACE_COLORS.compensator}
              disabled={readOnly}
              {...events}
            />
          </>
        )}
      />
      {hiddenBench > 0 && benchShown && (
        <p className="mt-1 px-1 text-xs text-slate-600" data-testid="bench-clipped">
          {hiddenBench} bench point{hiddenBench === 1 ? '' : 's'} lie outside the sweep ({formatSi(sweep.fStart, 'Hz')} – {formatSi(sweep.fStop, 'Hz')}) and are not drawn.{' '}
          {onWidenSweep && !readOnly && (
            <button type="button" className="text-indigo-700 underline" onClick={onWidenSweep} data-testid="bench-widen-sweep">
              Widen the sweep to show them
            </button>
          )}
        </p>
      )}
    </div>
  );
}

/**
 * Marks `phasewright:first-loop` on the performance timeline (the bench reads it) once the
 * SVG loop has been painted, then lets Plotly load.
 */
function AfterFirstPaint({ onPainted }: { onPainted: () => void }) {
  useEffect(() => {
    const frame = requestAnimationFrame(() => {
      if (performance.getEntriesByName(FIRST_LOOP_MARK).length === 0) performance.mark(FIRST_LOOP_MARK);
      setTimeout(onPainted, 0);
    });
    return () => cancelAnimationFrame(frame);
  }, [onPainted]);
  return null;
}

export const FIRST_LOOP_MARK = 'phasewright:first-loop';
export const PLOTLY_DRAWN_MARK = 'phasewright:plotly-drawn';
