/**
 * The report's closed-loop sections: the step response (averaged loop, with the checks for
 * what the model cannot show) and the switching check of the averaged model (loop gain read
 * from the cycle-by-cycle simulation at a few frequencies), as inline SVG and tables.
 */
import { modelCheck, type ModelCheckResult } from '@/lib/engine/switching-check';
import { simulateStepResponse, type StepResponseResult } from '@/lib/engine/step-response';
import type { AnalyzeRequest, AnalyzeResult } from '@/lib/engine/types';
import { describeStep, stepOf } from '@/lib/step-summary';
import { formatSi } from '@/lib/units/si';
import { TRACE_COLORS } from '@/lib/catalog/traces';
import { plotSvg } from './svg-plot';
import esc from 'escape-html';

const PLOT_COLORS = TRACE_COLORS;

const r1 = (v: number) => Math.round(v * 10) / 10;
const signed = (v: number, dp: number) => `${v < 0 ? '−' : '+'}${Math.abs(v).toFixed(dp)}`;

/** Output voltage against time (linear axes) with the settling band, as one `<svg>`. */
export function stepSvg(r: StepResponseResult, title: string, width = 700, height = 240): string {
  const m = { l: 64, r: 14, t: 14, b: 34 };
  const tEnd = r.t[r.t.length - 1];
  const [factor, unit] = tEnd < 2e-3 ? [1e6, 'µs'] : [1e3, 'ms'];
  const band = r.band * r.vout[0];
  const ys = [...r.vout, r.finalVout + band, r.finalVout - band];
  let lo = Math.min(...ys);
  let hi = Math.max(...ys);
  const pad = (hi - lo) * 0.08 || 1e-3;
  lo -= pad;
  hi += pad;
  const t0 = r.t[0];
  const x = (t: number) => m.l + ((t - t0) / (tEnd - t0)) * (width - m.l - m.r);
  const y = (v: number) => m.t + ((hi - v) / (hi - lo)) * (height - m.t - m.b);
  const path = r.t.map((t, i) => `${i === 0 ? 'M' : 'L'}${r1(x(t))},${r1(y(r.vout[i]))}`).join('');
  const ticks = 5;
  const yTicks = Array.from({ length: ticks + 1 }, (_, i) => lo + ((hi - lo) * i) / ticks);
  const xTicks = Array.from({ length: ticks + 1 }, (_, i) => (tEnd * i) / ticks);
  const grid = [
    ...yTicks.map((v) => `<line x1="${m.l}" x2="${width - m.r}" y1="${r1(y(v))}" y2="${r1(y(v))}" stroke="${PLOT_COLORS.grid}"/><text x="${m.l - 6}" y="${r1(y(v)) + 3}" text-anchor="end" font-size="10" fill="${PLOT_COLORS.text}">${v.toFixed(4)}</text>`),
    ...xTicks.map((t) => `<line x1="${r1(x(t))}" x2="${r1(x(t))}" y1="${m.t}" y2="${height - m.b}" stroke="${PLOT_COLORS.grid}"/><text x="${r1(x(t))}" y="${height - m.b + 13}" text-anchor="middle" font-size="10" fill="${PLOT_COLORS.text}">${Number((t * factor).toPrecision(3))}</text>`),
  ].join('');
  const bandLines = [r.finalVout + band, r.finalVout - band]
    .map((v) => `<line x1="${m.l}" x2="${width - m.r}" y1="${r1(y(v))}" y2="${r1(y(v))}" stroke="${PLOT_COLORS.guide}" stroke-dasharray="3 3"/>`)
    .join('');
  return `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${width} ${height}" role="img" aria-label="${esc(title)}"><title>${esc(title)}</title>${grid}${bandLines}<path d="${path}" fill="none" stroke="${PLOT_COLORS.loop}" stroke-width="2"/><text x="${(m.l + width - m.r) / 2}" y="${height - 4}" text-anchor="middle" font-size="10.5" fill="${PLOT_COLORS.text}">Time after the step (${unit})</text><text x="12" y="${(m.t + height - m.b) / 2}" transform="rotate(-90 12 ${(m.t + height - m.b) / 2})" text-anchor="middle" font-size="10.5" fill="${PLOT_COLORS.text}">Output (V)</text></svg>`;
}

const stepSection = (input: AnalyzeRequest): string => {
  const step = stepOf(input);
  let r: StepResponseResult;
  try {
    r = simulateStepResponse(input, step);
  } catch (err) {
    return `<section><h2>Step response</h2><p>The step (${esc(describeStep(step))}) could not be simulated: ${esc(err instanceof Error ? err.message : String(err))}</p></section>`;
  }
  const rows: [string, string][] = [
    ['Step', describeStep(step)],
    ['Peak deviation', `${r.peakDeviation < 0 ? '−' : ''}${formatSi(Math.abs(r.peakDeviation), 'V')}`],
    ['Overshoot past the final value', formatSi(r.overshoot, 'V')],
    [`Settling time to ±${(r.band * 100).toPrecision(2)} %`, r.settlingTime === null ? 'not settled in the window' : formatSi(r.settlingTime, 's')],
  ];
  const outside = r.outsideModel.length
    ? `<ul class="checks">${r.outsideModel.map((m) => `<li class="check risk"><span class="level">outside the model</span> ${esc(m)}</li>`).join('')}</ul>`
    : '<p class="muted small">The step stays inside the small-signal model (duty within 0–100 %, CCM before and after).</p>';
  return `<section class="plot"><h2>Step response</h2><table class="kv"><tbody>${rows.map(([k, v]) => `<tr><th>${esc(k)}</th><td>${esc(v)}</td></tr>`).join('')}</tbody></table>${stepSvg(r, `Step response: ${describeStep(step)}`)}${outside}</section>`;
};

const checkSection = (input: AnalyzeRequest, result: AnalyzeResult): string => {
  let c: ModelCheckResult;
  try {
    c = modelCheck(input);
  } catch (err) {
    return `<section><h2>Switching check</h2><p>Not run: ${esc(err instanceof Error ? err.message : String(err))}</p></section>`;
  }
  const pts = c.points;
  const svg = plotSvg({
    id: 'report-model-check',
    title: 'Loop gain of the averaged model with the switching check points',
    width: 700,
    panelHeight: 180,
    fRange: [result.bode.f[0], result.bode.f[result.bode.f.length - 1]],
    panels: [
      {
        title: 'Magnitude (dB)',
        step: 20,
        include: [0],
        guides: [0],
        clamp: [-120, 160],
        series: [
          { label: 'Loop gain T (model)', color: PLOT_COLORS.loop, f: result.bode.f, y: result.bode.loop.magDb },
          { label: 'Switching check', color: PLOT_COLORS.bench, f: pts.map((p) => p.hz), y: pts.map((p) => p.magDb), dots: true },
        ],
      },
      {
        title: 'Phase (°)',
        step: 45,
        coarserSteps: [90, 180],
        include: [-180],
        guides: [-180],
        clamp: [-450, 270],
        series: [
          { label: 'Loop gain T (model)', color: PLOT_COLORS.loop, f: result.bode.f, y: result.bode.loop.phaseDeg },
          { label: 'Switching check', color: PLOT_COLORS.bench, f: pts.map((p) => p.hz), y: pts.map((p) => p.phaseDeg), dots: true },
        ],
      },
    ],
  });
  const table = `<table class="grid"><thead><tr><th>Frequency</th><th>Switching |T|</th><th>Model |T|</th><th>Error</th><th>Switching ∠T</th><th>Model ∠T</th><th>Error</th></tr></thead><tbody>${pts
    .map(
      (p) =>
        `<tr><td>${esc(formatSi(p.hz, 'Hz'))}</td><td>${p.magDb.toFixed(2)} dB</td><td>${p.modelMagDb.toFixed(2)} dB</td><td>${signed(p.errorDb, 2)} dB</td><td>${p.phaseDeg.toFixed(1)}°</td><td>${p.modelPhaseDeg.toFixed(1)}°</td><td>${signed(p.errorDeg, 1)}°</td></tr>`,
    )
    .join('')}</tbody></table>`;
  return `<section class="plot"><h2>Switching check of the model</h2><p class="muted small">The switching circuit simulated cycle by cycle (${c.cycleCount} cycles) with small sine waves injected into the loop; the loop gain is read from the waveforms as a network analyzer would. Output ripple ${esc(formatSi(c.steadyState.voutRipplePp, 'V'))} p-p, inductor ripple ${esc(formatSi(c.steadyState.inductorRipplePp, 'A'))} p-p.</p>${svg}${table}</section>`;
};

/** Both sections as HTML for the report. */
export function timeDomainSections(input: AnalyzeRequest, result: AnalyzeResult): string {
  return stepSection(input) + checkSection(input, result);
}
