'use client';

/**
 * Bode plot: magnitude (top) and phase (bottom) stacked on one logarithmic
 * frequency axis, drawn by Plotly. Reusable by Tune, Compare and Handoff.
 *
 * Props
 * - `f`: the frequencies (Hz) the series are sampled at.
 * - `series`: curves { id, name, color, f?, magDb, phaseDeg, dash?, width?, visible? };
 *   `f` defaults to the plot's `f`. Compare passes two loops (the second e.g.
 *   with dash: 'dash'); Tune passes loop, plant and compensator.
 * - `bench`: measured response(s) { f, gainDb, phaseDeg, name? } drawn as grey
 *   dots on both panels (Bench data).
 * - `markers`: poles/zeros marked on the magnitude panel, not draggable:
 *   { id, hz, magDb, kind: 'pole' | 'zero', label, color } (pole ✕, zero ○).
 * - `margins`: one or several loops' margins { crossoverHz, phaseMarginDeg,
 *   phaseCrossoverHz, gainMarginDb, color?, label? }: fc on both panels, the
 *   phase margin as a bar from −180° up to the phase at fc, the gain margin
 *   as a bar at the −180° crossing.
 * - `extraTraces`: raw Plotly traces appended as given (xaxis 'x' / yaxis 'y'
 *   for magnitude, 'x2' / 'y2' for phase).
 * - `labelObstacles(geometry)`: boxes in px the text labels keep clear of
 *   (Tune passes its handles, where the overlay draws them).
 * - `freezeRanges`: keep the current axis ranges and label places (Tune sets
 *   it while a handle is dragged so the plot does not jump under the pointer).
 * - `holdRangesKey`: while this key stays the same, the magnitude range is kept unless the
 *   curves leave it by more than 20 dB (Tune: a gain edit does not rescale the axis, so a
 *   handle dragged up and back by the same pixels moves by the same dB each way).
 * - `overlay(geometry)`: rendered above the plot with a PlotGeometry mapping
 *   Hz/dB/degrees ↔ pixels (the Tune handles use it).
 * - `showLegend` (default true), `height` (px, default 460).
 *
 * The labels (fc, PM, GM, marker names) are annotations placed in pixels so
 * they do not cover each other (label-placement.ts).
 *
 * 0 dB and −180° guides are always drawn. Phase has its own panel, so curves
 * are solid unless a series asks for a dash.
 */
import { useMemo, useRef, useState } from 'react';
import { PlotlyChart } from './plotly-chart';
import { computeGeometry, plotMargin, type PlotGeometry, type Ranges } from './geometry';
import {
  buildBodeLabels,
  buildBodeLayout,
  buildBodeTraces,
  computeRanges,
  isMarginLabel,
  type BenchOverlay,
  type BodeSeries,
  type LabelObstacles,
  type MarginMarks,
  type PlotMarker,
} from './bode-traces';
import type { Annotation, Data } from 'plotly.js-dist-min';

export type { PlotGeometry } from './geometry';
export type { BenchOverlay, BodeSeries, LabelObstacles, MarginMarks, PlotMarker } from './bode-traces';
export { BENCH_GREY } from './bode-traces';

export interface BodePlotProps {
  f: number[];
  series: BodeSeries[];
  bench?: BenchOverlay | BenchOverlay[];
  markers?: PlotMarker[];
  margins?: MarginMarks | MarginMarks[];
  extraTraces?: Data[];
  labelObstacles?: LabelObstacles;
  freezeRanges?: boolean;
  holdRangesKey?: string;
  overlay?: (geometry: PlotGeometry) => React.ReactNode;
  showLegend?: boolean;
  height?: number;
  className?: string;
  'aria-label'?: string;
}

const asList = <T,>(v: T | T[] | undefined): T[] | undefined => (v === undefined ? undefined : Array.isArray(v) ? v : [v]);

export function BodePlot(props: BodePlotProps) {
  const { f, series, markers, extraTraces, labelObstacles, freezeRanges = false, holdRangesKey, overlay, showLegend = true, height = 460, className } = props;
  const bench = useMemo(() => asList(props.bench), [props.bench]);
  const margins = useMemo(() => asList(props.margins), [props.margins]);
  const [width, setWidth] = useState(0);
  const frozen = useRef<Ranges | null>(null);
  const frozenLabels = useRef<Partial<Annotation>[] | null>(null);

  const held = useRef<{ key: string; mag: [number, number] } | null>(null);
  const fresh = useMemo(() => {
    const r = computeRanges({ f, series, bench });
    if (holdRangesKey === undefined) return r;
    const h = held.current;
    if (h && h.key === holdRangesKey && r.mag[0] >= h.mag[0] - 20 && r.mag[1] <= h.mag[1] + 20) return { ...r, mag: h.mag };
    held.current = { key: holdRangesKey, mag: r.mag };
    return r;
  }, [f, series, bench, holdRangesKey]);
  if (!freezeRanges || !frozen.current) frozen.current = fresh;
  const ranges = frozen.current;

  const data = useMemo(
    () => buildBodeTraces({ f, series, bench, markers, margins, extraTraces }, ranges),
    [f, series, bench, markers, margins, extraTraces, ranges],
  );
  const geometry = useMemo(() => computeGeometry(width, height, ranges, plotMargin(showLegend)), [width, height, ranges, showLegend]);
  // While frozen (a drag) the labels stay where they were, so Plotly is not redrawn every frame;
  // the margin labels go when the margins do (Tune draws live ones then).
  const labels = useMemo(() => {
    if (freezeRanges && frozenLabels.current) return margins ? frozenLabels.current : frozenLabels.current.filter((a) => !isMarginLabel(a));
    return buildBodeLabels({ f, series, markers, margins }, geometry, labelObstacles);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [f, series, markers, margins, geometry, freezeRanges ? null : labelObstacles, freezeRanges]);
  if (!freezeRanges) frozenLabels.current = labels;
  const layout = useMemo(() => buildBodeLayout(ranges, height, showLegend, labels), [ranges, height, showLegend, labels]);

  return (
    <PlotlyChart
      data={data}
      layout={layout}
      className={className}
      onSize={(s) => setWidth(s.width)}
      data-testid="bode-plot"
      aria-label={props['aria-label'] ?? 'Bode plot'}
    >
      <div style={{ height }} />
      {overlay && width > 0 && overlay(geometry)}
    </PlotlyChart>
  );
}
