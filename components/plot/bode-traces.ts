/**
 * Plotly traces and layout of the Bode plot, as pure functions of the data
 * (no React, no Plotly import), so the drag benchmark can time them too.
 * See bode-plot.tsx for what each prop means.
 */
import { TRACE_COLORS } from '@/lib/catalog/traces';
import type { Annotation, Data, Layout } from 'plotly.js-dist-min';
import { formatSi } from '@/lib/units/si';
import { MAG_DOMAIN, PHASE_DOMAIN, plotMargin, type PlotGeometry, type Ranges } from './geometry';
import { around, placeLabels, type Box, type LabelRequest, type LabelSide } from './label-placement';

export interface BodeSeries {
  id: string;
  name: string;
  color: string;
  f?: number[];
  magDb: number[];
  phaseDeg: number[];
  dash?: 'solid' | 'dash' | 'dot' | 'dashdot';
  width?: number;
  visible?: boolean;
}

export interface BenchOverlay {
  f: number[];
  gainDb: number[];
  phaseDeg: number[];
  name?: string;
}

export interface PlotMarker {
  id: string;
  hz: number;
  magDb: number;
  kind: 'pole' | 'zero';
  label: string;
  color: string;
}

export interface MarginMarks {
  crossoverHz: number | null;
  phaseMarginDeg: number | null;
  phaseCrossoverHz: number | null;
  gainMarginDb: number | null;
  color?: string;
  /** Prefix for the labels when several loops are shown ("r3 "). */
  label?: string;
}

export interface BodeContent {
  f: number[];
  series: BodeSeries[];
  bench?: BenchOverlay[];
  markers?: PlotMarker[];
  margins?: MarginMarks[];
  extraTraces?: Data[];
}

export const BENCH_GREY = TRACE_COLORS.bench;
const GUIDE = TRACE_COLORS.guide;
const GRID = TRACE_COLORS.grid;

/** Range holding the values (and `must`), widened to whole `step`s plus `pad`, so no tick sits on an edge. */
function niceRange(values: Iterable<number>, step: number, pad: number, fallback: [number, number], must: number): [number, number] {
  let lo = must;
  let hi = must;
  let any = false;
  for (const v of values) {
    if (!Number.isFinite(v)) continue;
    any = true;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (!any) return fallback;
  return [Math.floor(lo / step) * step - pad, Math.ceil(hi / step) * step + pad];
}

function* each(arrays: number[][], clampLo = -Infinity, clampHi = Infinity) {
  for (const a of arrays) for (const v of a) yield Math.max(clampLo, Math.min(clampHi, v));
}

/** Axis ranges that hold every visible curve: x in log10(Hz), magnitude in 20 dB steps, phase in 45° steps. */
export function computeRanges({ f, series, bench = [] }: BodeContent): Ranges {
  const shown = series.filter((s) => s.visible !== false);
  const fs = [...(shown.length ? [f] : []), ...shown.filter((s) => s.f).map((s) => s.f!), ...bench.map((b) => b.f)];
  let fMin = Infinity;
  let fMax = -Infinity;
  for (const v of each(fs)) {
    if (v > 0 && v < fMin) fMin = v;
    if (v > fMax) fMax = v;
  }
  if (!Number.isFinite(fMin) || !(fMax > fMin)) [fMin, fMax] = [10, 1e6];
  return {
    x: [Math.log10(fMin), Math.log10(fMax)],
    mag: niceRange(each([...shown.map((s) => s.magDb), ...bench.map((b) => b.gainDb)], -120, 160), 20, 6, [-60, 60], 0),
    phase: niceRange(each([...shown.map((s) => s.phaseDeg), ...bench.map((b) => b.phaseDeg)]), 45, 12, [-270, 90], -180),
  };
}

/** Ticks at 1, 2, 5 × 10^k inside the range; only the decades carry a label (10 Hz, 1 kHz, …). */
function frequencyTicks(r: Ranges): { tickvals: number[]; ticktext: string[] } {
  const tickvals: number[] = [];
  const ticktext: string[] = [];
  for (let e = Math.floor(r.x[0]); e <= Math.ceil(r.x[1]); e++) {
    for (const m of [1, 2, 5]) {
      const v = m * 10 ** e;
      if (Math.log10(v) < r.x[0] - 1e-9 || Math.log10(v) > r.x[1] + 1e-9) continue;
      tickvals.push(v);
      ticktext.push(m === 1 ? formatSi(v, 'Hz') : '');
    }
  }
  return { tickvals, ticktext };
}


function line(x: number[], y: number[], xaxis: string, yaxis: string, color: string, width: number, dash: 'dash' | 'dot'): Data {
  return { type: 'scatter', mode: 'lines', x, y, xaxis, yaxis, showlegend: false, hoverinfo: 'skip', line: { color, width, dash } };
}

function marginTraces(m: MarginMarks, r: Ranges): Data[] {
  const color = m.color ?? TRACE_COLORS.loop;
  const pre = m.label ? `${m.label} ` : '';
  const out: Data[] = [];
  if (m.crossoverHz !== null) {
    const fc = m.crossoverHz;
    out.push(line([fc, fc], r.mag, 'x', 'y', color, 1, 'dot'), line([fc, fc], r.phase, 'x2', 'y2', color, 1, 'dot'), {
      type: 'scatter',
      mode: 'markers',
      x: [fc],
      y: [0],
      xaxis: 'x',
      yaxis: 'y',
      showlegend: false,
      marker: { size: 7, color },
      hovertemplate: `${pre}crossover fc %{x:.3s}Hz<extra></extra>`,
    });
    if (m.phaseMarginDeg !== null) {
      out.push({
        type: 'scatter',
        mode: 'lines',
        x: [fc, fc],
        y: [-180, m.phaseMarginDeg - 180],
        xaxis: 'x2',
        yaxis: 'y2',
        showlegend: false,
        line: { color, width: 3 },
        hovertemplate: `${pre}phase margin ${m.phaseMarginDeg.toFixed(1)}°<extra></extra>`,
      });
    }
  }
  if (m.phaseCrossoverHz !== null && m.gainMarginDb !== null) {
    const f180 = m.phaseCrossoverHz;
    out.push({
      type: 'scatter',
      mode: 'lines',
      x: [f180, f180],
      y: [0, -m.gainMarginDb],
      xaxis: 'x',
      yaxis: 'y',
      showlegend: false,
      line: { color, width: 3 },
      hovertemplate: `${pre}gain margin ${m.gainMarginDb.toFixed(1)} dB<extra></extra>`,
    });
  }
  return out;
}

/** Every Plotly trace of the plot: guides, curves (magnitude on x/y, phase on x2/y2), bench dots, margins, markers. */
export function buildBodeTraces(c: BodeContent, r: Ranges): Data[] {
  const fLo = 10 ** r.x[0];
  const fHi = 10 ** r.x[1];
  // Guides first, so the curves draw over them.
  const out: Data[] = [line([fLo, fHi], [0, 0], 'x', 'y', GUIDE, 1, 'dash'), line([fLo, fHi], [-180, -180], 'x2', 'y2', GUIDE, 1, 'dash')];
  for (const s of c.series) {
    const common = { type: 'scatter' as const, mode: 'lines' as const, x: s.f ?? c.f, legendgroup: s.id, visible: s.visible !== false };
    const style = { color: s.color, width: s.width ?? 2, dash: s.dash ?? 'solid' };
    out.push(
      { ...common, name: s.name, y: s.magDb, xaxis: 'x', yaxis: 'y', line: style, hovertemplate: `${s.name}<br>%{x:.3s}Hz · %{y:.1f} dB<extra></extra>` },
      {
        ...common,
        name: `${s.name} phase`,
        showlegend: false,
        y: s.phaseDeg,
        xaxis: 'x2',
        yaxis: 'y2',
        line: style,
        hovertemplate: `${s.name} phase<br>%{x:.3s}Hz · %{y:.1f}°<extra></extra>`,
      },
    );
  }
  (c.bench ?? []).forEach((b, i, all) => {
    const name = b.name ?? (all.length > 1 ? `Bench data ${i + 1}` : 'Bench data');
    const marker = { color: BENCH_GREY, size: 5, opacity: 0.85 };
    const dots = { type: 'scatter' as const, mode: 'markers' as const, name, legendgroup: `bench-${i}`, x: b.f, marker };
    out.push(
      { ...dots, y: b.gainDb, xaxis: 'x', yaxis: 'y', hovertemplate: `${name}<br>%{x:.3s}Hz · %{y:.1f} dB<extra></extra>` },
      { ...dots, showlegend: false, y: b.phaseDeg, xaxis: 'x2', yaxis: 'y2', hovertemplate: `${name}<br>%{x:.3s}Hz · %{y:.1f}°<extra></extra>` },
    );
  });
  for (const m of c.margins ?? []) out.push(...marginTraces(m, r));
  for (const m of c.markers ?? []) {
    out.push({
      type: 'scatter',
      mode: 'markers',
      showlegend: false,
      x: [m.hz],
      y: [m.magDb],
      xaxis: 'x',
      yaxis: 'y',
      marker: { symbol: m.kind === 'pole' ? 'x-thin-open' : 'circle-open', size: 12, color: m.color, line: { color: m.color, width: 2 } },
      hovertemplate: `${m.label}<br>%{x:.3s}Hz<extra></extra>`,
    });
  }
  out.push(...(c.extraTraces ?? []));
  return out;
}

/** Two stacked panels on one log frequency axis; fixed margins so overlays can map pixels (geometry.ts). */
export function buildBodeLayout(r: Ranges, height: number, showLegend: boolean, annotations: Partial<Annotation>[] = []): Partial<Layout> {
  const axis = { gridcolor: GRID, fixedrange: true, automargin: false, zeroline: false };
  return {
    height,
    margin: { ...plotMargin(showLegend), pad: 0 },
    paper_bgcolor: '#ffffff',
    plot_bgcolor: '#ffffff',
    font: { family: 'Inter Variable, system-ui, sans-serif', size: 12, color: TRACE_COLORS.text },
    showlegend: showLegend,
    legend: { orientation: 'h', x: 0, y: 1, yanchor: 'bottom', font: { size: 11 }, itemclick: false, itemdoubleclick: false },
    hovermode: 'closest',
    dragmode: false,
    annotations,
    xaxis: { ...axis, type: 'log', range: r.x, domain: [0, 1], anchor: 'y', showticklabels: false, tickmode: 'array', tickvals: frequencyTicks(r).tickvals },
    xaxis2: {
      ...axis,
      type: 'log',
      range: r.x,
      domain: [0, 1],
      anchor: 'y2',
      matches: 'x',
      tickmode: 'array',
      ...frequencyTicks(r),
      title: { text: 'Frequency', standoff: 2, font: { size: 11 } },
    },
    yaxis: { ...axis, domain: MAG_DOMAIN, range: r.mag, tick0: 0, dtick: r.mag[1] - r.mag[0] > 160 ? 40 : 20, ticksuffix: ' dB', title: { text: 'Magnitude', font: { size: 11 } } },
    yaxis2: {
      ...axis,
      domain: PHASE_DOMAIN,
      range: r.phase,
      tick0: 0,
      dtick: r.phase[1] - r.phase[0] > 360 ? 90 : 45,
      ticksuffix: '°',
      title: { text: 'Phase', font: { size: 11 } },
    },
  };
}

/** Boxes (px) the labels must keep clear of, beyond the plot's own markers: e.g. Tune's handles where the overlay draws them. */
export type LabelObstacles = (g: PlotGeometry) => Box[];

interface PlotLabel {
  id: string;
  text: string;
  hz: number;
  value: number;
  panel: 'mag' | 'phase';
  color: string;
  prefer: LabelSide;
  hover: string;
}

/** The text labels, most important first: each crossover, then the named features, then the margin bars. */
function plotLabels(c: BodeContent): PlotLabel[] {
  const fcs: PlotLabel[] = [];
  const bars: PlotLabel[] = [];
  (c.margins ?? []).forEach((m, i) => {
    const color = m.color ?? TRACE_COLORS.loop;
    const pre = m.label ? `${m.label} ` : '';
    if (m.crossoverHz !== null) {
      const fc = m.crossoverHz;
      fcs.push({ id: `fc-${i}`, text: `${pre}fc ${formatSi(fc, 'Hz')}`, hz: fc, value: 0, panel: 'mag', color, prefer: 'below-right', hover: `${pre}crossover fc` });
      if (m.phaseMarginDeg !== null)
        bars.push({
          id: `pm-${i}`,
          text: `${pre}PM ${m.phaseMarginDeg.toFixed(1)}°`,
          hz: fc,
          value: m.phaseMarginDeg - 180,
          panel: 'phase',
          color,
          prefer: 'above-right',
          hover: `${pre}phase margin`,
        });
    }
    if (m.phaseCrossoverHz !== null && m.gainMarginDb !== null)
      bars.push({
        id: `gm-${i}`,
        text: `${pre}GM ${m.gainMarginDb.toFixed(1)} dB`,
        hz: m.phaseCrossoverHz,
        value: -m.gainMarginDb,
        panel: 'mag',
        color,
        prefer: 'below-left',
        hover: `${pre}gain margin`,
      });
  });
  // Several loops (Compare): the lowest crossover's labels lean left, the highest's right, so each stays on its own side of its line.
  for (const group of [fcs, bars.filter((b) => b.id.startsWith('pm-')), bars.filter((b) => b.id.startsWith('gm-'))]) {
    if (group.length < 2) continue;
    const sorted = [...group].sort((a, b) => a.hz - b.hz);
    sorted[0].prefer = sorted[0].prefer.startsWith('above') ? 'above-left' : 'below-left';
    const last = sorted[sorted.length - 1];
    last.prefer = last.prefer.startsWith('above') ? 'above-right' : 'below-right';
  }
  const features = (c.markers ?? []).map<PlotLabel>((m) => ({ id: `marker-${m.id}`, text: m.label, hz: m.hz, value: m.magDb, panel: 'mag', color: m.color, prefer: 'above', hover: m.label }));
  return [...fcs, ...features, ...bars];
}

/** Whether an annotation from buildBodeLabels names a margin (fc, PM, GM) rather than a marker. */
export const isMarginLabel = (a: Partial<Annotation>) => /^(fc|pm|gm)-/.test(a.name ?? '');

/**
 * The labels as Plotly annotations, placed in pixels (label-placement.ts) so
 * they keep clear of each other, of the markers and bars, of `obstacles`
 * (Tune's handles) and, where they can, of the curves.
 */
export function buildBodeLabels(c: BodeContent, g: PlotGeometry, obstacles?: LabelObstacles): Partial<Annotation>[] {
  if (!(g.right - g.left > 40)) return [];
  const labels = plotLabels(c);
  if (!labels.length) return [];
  const y = (l: { panel: 'mag' | 'phase'; value: number }) => (l.panel === 'mag' ? g.dbToY(l.value) : g.degToY(l.value));
  const magBounds: Box = { x0: g.left, y0: g.magTop, x1: g.right, y1: g.magBottom };
  const phaseBounds: Box = { x0: g.left, y0: g.phaseTop, x1: g.right, y1: g.phaseBottom };

  const boxes: Box[] = obstacles ? obstacles(g) : [];
  for (const m of c.markers ?? []) boxes.push(around(g.hzToX(m.hz), g.dbToY(m.magDb), 8));
  for (const m of c.margins ?? []) {
    if (m.crossoverHz !== null) {
      const x = g.hzToX(m.crossoverHz);
      boxes.push(around(x, g.dbToY(0), 5));
      if (m.phaseMarginDeg !== null) boxes.push({ x0: x - 2, x1: x + 2, y0: g.degToY(m.phaseMarginDeg - 180), y1: g.degToY(-180) });
    }
    if (m.phaseCrossoverHz !== null && m.gainMarginDb !== null) {
      const x = g.hzToX(m.phaseCrossoverHz);
      const [a, b] = [g.dbToY(0), g.dbToY(-m.gainMarginDb)];
      boxes.push({ x0: x - 2, x1: x + 2, y0: Math.min(a, b), y1: Math.max(a, b) });
    }
  }
  const points: { x: number; y: number }[] = [];
  for (const s of c.series) {
    if (s.visible === false) continue;
    const f = s.f ?? c.f;
    for (let i = 0; i < f.length; i++) {
      points.push({ x: g.hzToX(f[i]), y: g.dbToY(s.magDb[i]) });
      points.push({ x: g.hzToX(f[i]), y: g.degToY(s.phaseDeg[i]) });
    }
  }

  const requests: LabelRequest[] = labels.map((l) => ({
    id: l.id,
    text: l.text,
    x: g.hzToX(l.hz),
    y: y(l),
    prefer: l.prefer,
    bounds: l.panel === 'mag' ? magBounds : phaseBounds,
  }));
  const placed = placeLabels(requests, { boxes, points });
  return labels.map((l, i) => {
    const p = placed[i];
    return {
      name: l.id,
      xref: l.panel === 'mag' ? 'x' : 'x2',
      yref: l.panel === 'mag' ? 'y' : 'y2',
      // Annotation on a log axis take log10 of the value.
      x: Math.log10(l.hz),
      y: l.value,
      text: l.text,
      hovertext: l.hover,
      showarrow: true,
      axref: 'pixel',
      ayref: 'pixel',
      ax: p.dx,
      ay: p.dy,
      arrowhead: 0,
      arrowwidth: 1,
      arrowcolor: p.leader ? l.color : 'rgba(0,0,0,0)',
      standoff: 2,
      xanchor: 'center',
      yanchor: 'middle',
      font: { size: 11, color: l.color },
      bgcolor: 'rgba(255,255,255,0.85)',
      borderpad: 1,
    } satisfies Partial<Annotation>;
  });
}
