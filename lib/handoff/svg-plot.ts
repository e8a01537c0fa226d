/**
 * Log-frequency plots as standalone SVG text, drawn on the server: the Bode plots of the
 * printable report (which must print without JavaScript) and the small model-versus-bench
 * plots of the Handoff screen. Panels share the frequency axis and stack vertically.
 * Pure string building: every label is escaped, every number rounded to 0.1 px.
 */
import { TRACE_COLORS } from '@/lib/catalog/traces';
import { formatSi } from '@/lib/units/si';
import esc from 'escape-html';

const PLOT_COLORS = TRACE_COLORS;

export interface SvgSeries {
  label: string;
  color: string;
  f: readonly number[];
  y: readonly number[];
  /** Dashed line. */
  dashed?: boolean;
  /** Draw as dots (bench data) instead of a line. */
  dots?: boolean;
}

export interface SvgPanel {
  /** Axis title, e.g. "Magnitude (dB)". */
  title: string;
  series: SvgSeries[];
  /** Horizontal guide lines (0 dB, −180°). */
  guides?: number[];
  /** Smallest tick step; the range is widened to multiples of the step chosen. */
  step: number;
  /** Larger steps to choose from, smallest first, when `step` would give more than 8 ticks. */
  coarserSteps?: number[];
  /** Values the range must include. */
  include?: number[];
  /** Clamp of the range (wild values are cut, not allowed to flatten the plot). */
  clamp?: [number, number];
}

export interface SvgPlotOptions {
  panels: SvgPanel[];
  width?: number;
  panelHeight?: number;
  /** Prefix for element ids (clip paths), unique per page. */
  id: string;
  /** Accessible description. */
  title: string;
  /** Frequency range; defaults to the span of all series. */
  fRange?: [number, number];
  /** Most dots drawn per dotted series (evenly thinned in log f beyond that). */
  maxDots?: number;
  /** Vertical markers across every panel (e.g. the crossover). */
  markers?: { f: number; label: string; color: string }[];
}

const r1 = (v: number) => Math.round(v * 10) / 10;

const MARGIN = { l: 58, r: 14, t: 26, b: 30 };

function niceRange(values: number[], step: number, include: number[], clamp?: [number, number]): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    if (!Number.isFinite(v)) continue;
    const c = clamp ? Math.max(clamp[0], Math.min(clamp[1], v)) : v;
    if (c < lo) lo = c;
    if (c > hi) hi = c;
  }
  for (const v of include) {
    lo = Math.min(lo, v);
    hi = Math.max(hi, v);
  }
  if (!Number.isFinite(lo)) return [-step, step];
  lo = Math.floor(lo / step) * step;
  hi = Math.ceil(hi / step) * step;
  if (hi - lo < step) hi = lo + step;
  return [lo, hi];
}

/** Keep at most `max` points, the first of each equal log-f bucket. */
function thin(f: readonly number[], y: readonly number[], max: number): [number[], number[]] {
  if (f.length <= max) return [[...f], [...y]];
  const a = Math.log(f[0]);
  const span = Math.log(f[f.length - 1]) - a || 1;
  const fx: number[] = [];
  const yx: number[] = [];
  let last = -1;
  for (let k = 0; k < f.length; k++) {
    const bucket = Math.floor(((Math.log(f[k]) - a) / span) * (max - 1));
    if (bucket !== last) {
      fx.push(f[k]);
      yx.push(y[k]);
      last = bucket;
    }
  }
  return [fx, yx];
}

/** Frequencies to label: decades, plus 2 and 5 when fewer than three decades show. */
function frequencyTicks(lo: number, hi: number): { major: number[]; minor: number[] } {
  const major: number[] = [];
  const minor: number[] = [];
  const d0 = Math.floor(Math.log10(lo));
  const d1 = Math.ceil(Math.log10(hi));
  const few = d1 - d0 <= 3;
  for (let d = d0; d <= d1; d++) {
    for (let m = 1; m <= 9; m++) {
      const v = m * 10 ** d;
      if (v < lo * 0.999 || v > hi * 1.001) continue;
      if (m === 1 || (few && (m === 2 || m === 5))) major.push(v);
      else minor.push(v);
    }
  }
  return { major, minor };
}

/** The plot as one `<svg>` element (width × panels·panelHeight). */
export function plotSvg(opts: SvgPlotOptions): string {
  const width = opts.width ?? 720;
  const ph = opts.panelHeight ?? 210;
  const height = ph * opts.panels.length;
  const maxDots = opts.maxDots ?? 800;
  const allF = opts.panels.flatMap((p) => p.series.flatMap((s) => s.f as number[])).filter((v) => v > 0);
  const [fLo, fHi] = opts.fRange ?? (allF.length ? [Math.min(...allF), Math.max(...allF)] : [10, 1e6]);
  const lx0 = Math.log10(fLo);
  const lxSpan = Math.log10(fHi) - lx0 || 1;
  const left = MARGIN.l;
  const right = width - MARGIN.r;
  const x = (f: number) => left + ((Math.log10(f) - lx0) / lxSpan) * (right - left);
  const ticks = frequencyTicks(fLo, fHi);

  const out: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${width} ${height}" width="${width}" height="${height}" role="img" aria-label="${esc(opts.title)}" font-family="Inter, system-ui, sans-serif" font-size="11">`,
    `<title>${esc(opts.title)}</title>`,
  ];

  opts.panels.forEach((panel, i) => {
    const top = i * ph + MARGIN.t;
    const bottom = (i + 1) * ph - MARGIN.b;
    const values = panel.series.flatMap((s) => s.y as number[]);
    let step = panel.step;
    let [yLo, yHi] = niceRange(values, step, panel.include ?? [], panel.clamp);
    for (const coarser of panel.coarserSteps ?? [2, 5, 10, 20, 50].map((m) => m * panel.step)) {
      if ((yHi - yLo) / step <= 8) break;
      step = coarser;
      [yLo, yHi] = niceRange(values, step, panel.include ?? [], panel.clamp);
    }
    const y = (v: number) => bottom - ((Math.max(yLo, Math.min(yHi, v)) - yLo) / (yHi - yLo)) * (bottom - top);
    const clip = `${opts.id}-clip-${i}`;
    out.push(`<defs><clipPath id="${esc(clip)}"><rect x="${left}" y="${top}" width="${right - left}" height="${bottom - top}"/></clipPath></defs>`);
    out.push(`<rect x="${left}" y="${top}" width="${right - left}" height="${bottom - top}" fill="#fff" stroke="#cbd5e1"/>`);
    for (const f of ticks.minor) out.push(`<line x1="${r1(x(f))}" x2="${r1(x(f))}" y1="${top}" y2="${bottom}" stroke="${PLOT_COLORS.grid}" stroke-width="0.5"/>`);
    for (const f of ticks.major) {
      out.push(`<line x1="${r1(x(f))}" x2="${r1(x(f))}" y1="${top}" y2="${bottom}" stroke="${PLOT_COLORS.grid}"/>`);
      out.push(`<text x="${r1(x(f))}" y="${bottom + 14}" text-anchor="middle" fill="${PLOT_COLORS.text}">${esc(formatSi(f, 'Hz'))}</text>`);
    }
    const nTicks = Math.round((yHi - yLo) / step);
    for (let k = 0; k <= nTicks; k++) {
      const v = yLo + k * step;
      out.push(`<line x1="${left}" x2="${right}" y1="${r1(y(v))}" y2="${r1(y(v))}" stroke="${PLOT_COLORS.grid}"/>`);
      out.push(`<text x="${left - 6}" y="${r1(y(v) + 4)}" text-anchor="end" fill="${PLOT_COLORS.text}">${+v.toFixed(6)}</text>`);
    }
    for (const g of panel.guides ?? []) {
      if (g < yLo || g > yHi) continue;
      out.push(`<line x1="${left}" x2="${right}" y1="${r1(y(g))}" y2="${r1(y(g))}" stroke="${PLOT_COLORS.guide}" stroke-dasharray="4 3"/>`);
    }
    out.push(
      `<text transform="translate(14 ${r1((top + bottom) / 2)}) rotate(-90)" text-anchor="middle" fill="${PLOT_COLORS.text}">${esc(panel.title)}</text>`,
    );
    out.push(`<g clip-path="url(#${esc(clip)})">`);
    for (const m of opts.markers ?? []) {
      if (!(m.f >= fLo && m.f <= fHi)) continue;
      out.push(`<line x1="${r1(x(m.f))}" x2="${r1(x(m.f))}" y1="${top}" y2="${bottom}" stroke="${m.color}" stroke-dasharray="2 3"/>`);
      if (i === 0) out.push(`<text x="${r1(x(m.f) + 4)}" y="${top + 12}" fill="${m.color}">${esc(m.label)}</text>`);
    }
    for (const s of panel.series) {
      if (s.dots) {
        const [fx, yx] = thin(s.f, s.y, maxDots);
        const dots = fx.map((f, k) => `<circle cx="${r1(x(f))}" cy="${r1(y(yx[k]))}" r="2.2"/>`).join('');
        out.push(`<g fill="${s.color}" fill-opacity="0.85" data-series="${esc(s.label)}">${dots}</g>`);
      } else {
        const pts = s.f.map((f, k) => `${r1(x(f))},${r1(y(s.y[k]))}`).join(' ');
        out.push(
          `<polyline fill="none" stroke="${s.color}" stroke-width="1.8"${s.dashed ? ' stroke-dasharray="6 4"' : ''} points="${pts}" data-series="${esc(s.label)}"/>`,
        );
      }
    }
    out.push('</g>');
    // Legend along the top edge of the panel.
    let lx = left;
    for (const s of panel.series) {
      const mark = s.dots
        ? `<circle cx="${lx + 6}" cy="${top - 9}" r="3" fill="${s.color}"/>`
        : `<line x1="${lx}" x2="${lx + 14}" y1="${top - 9}" y2="${top - 9}" stroke="${s.color}" stroke-width="2"${s.dashed ? ' stroke-dasharray="4 2"' : ''}/>`;
      out.push(mark, `<text x="${lx + 18}" y="${top - 5}" fill="${PLOT_COLORS.text}">${esc(s.label)}</text>`);
      lx += 26 + s.label.length * 6.2;
    }
  });
  out.push('</svg>');
  return out.join('');
}

interface TraceLike {
  magDb: readonly number[];
  phaseDeg: readonly number[];
}

export interface BodeLike {
  f: readonly number[];
  loop: TraceLike;
  plant?: TraceLike;
  compensator?: TraceLike;
}

export interface BenchLike {
  f: readonly number[];
  gainDb: readonly number[];
  phaseDeg: readonly number[];
}

/**
 * Magnitude and phase of the loop gain (with the plant and the compensator when asked) and,
 * when given, bench data as grey dots.
 */
export function bodeSvg(
  bode: BodeLike,
  opts: {
    id: string;
    title: string;
    parts?: boolean;
    loopLabel?: string;
    bench?: BenchLike | null;
    width?: number;
    panelHeight?: number;
    crossoverHz?: number | null;
  },
): string {
  const lines = (key: 'magDb' | 'phaseDeg'): SvgSeries[] => [
    { label: opts.loopLabel ?? 'Loop gain T', color: PLOT_COLORS.loop, f: bode.f, y: bode.loop[key] },
    ...(opts.parts && bode.plant ? [{ label: 'Power stage', color: PLOT_COLORS.plant, f: bode.f, y: bode.plant[key] }] : []),
    ...(opts.parts && bode.compensator ? [{ label: 'Compensator', color: PLOT_COLORS.compensator, f: bode.f, y: bode.compensator[key] }] : []),
  ];
  const bench = opts.bench;
  const f = [...bode.f, ...(bench?.f ?? [])];
  return plotSvg({
    id: opts.id,
    title: opts.title,
    width: opts.width,
    panelHeight: opts.panelHeight,
    fRange: [Math.min(...f), Math.max(...f)],
    markers: opts.crossoverHz ? [{ f: opts.crossoverHz, label: `fc ${formatSi(opts.crossoverHz, 'Hz')}`, color: PLOT_COLORS.loop }] : [],
    panels: [
      {
        title: 'Magnitude (dB)',
        step: 20,
        include: [0],
        guides: [0],
        clamp: [-120, 160],
        series: [...lines('magDb'), ...(bench ? [{ label: 'Bench data', color: PLOT_COLORS.bench, f: bench.f, y: bench.gainDb, dots: true }] : [])],
      },
      {
        title: 'Phase (°)',
        step: 45,
        coarserSteps: [90, 180],
        include: [-180],
        guides: [-180],
        clamp: [-450, 270],
        series: [...lines('phaseDeg'), ...(bench ? [{ label: 'Bench data', color: PLOT_COLORS.bench, f: bench.f, y: bench.phaseDeg, dots: true }] : [])],
      },
    ],
  });
}

/** Model minus measured: gain difference (dB) and phase difference (°). */
export function differenceSvg(
  diff: BenchLike,
  opts: { id: string; title: string; width?: number; panelHeight?: number; fRange?: [number, number] },
): string {
  return plotSvg({
    id: opts.id,
    title: opts.title,
    fRange: opts.fRange,
    width: opts.width,
    panelHeight: opts.panelHeight ?? 160,
    panels: [
      { title: 'Δ gain (dB)', step: 1, include: [-1, 1], guides: [0], clamp: [-40, 40], series: [{ label: 'Model − bench', color: PLOT_COLORS.difference, f: diff.f, y: diff.gainDb, dots: true }] },
      { title: 'Δ phase (°)', step: 5, coarserSteps: [10, 15, 30, 45, 90], include: [-5, 5], guides: [0], clamp: [-180, 180], series: [{ label: 'Model − bench', color: PLOT_COLORS.difference, f: diff.f, y: diff.phaseDeg, dots: true }] },
    ],
  });
}
