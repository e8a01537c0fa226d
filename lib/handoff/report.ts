/**
 * The printable report of a revision: one self-contained HTML page (inline CSS and SVG, no
 * script, no external fetch) that the browser prints to PDF. It shows the inputs, the
 * operating point, the Bode plots, the margins, the step response and the switching check of
 * the model, the parts, the Checks, the cautions, the
 * revision number, its sign-off state and the dates.
 */
import { formatIsoDay, formatIsoMinute, formatCount } from '@/lib/format';
import { CAUTIONS } from '@/lib/cautions';
import { AMPLIFIER_INPUTS, AMPLIFIER_LABELS, amplifierInputLabel, compensatorTitle, inputApplies, MODULATOR_MODE_LABELS, inputLabel, readInput, signoffLabel, STAGE_INPUTS, topologyLabel, type SignoffState } from '@/lib/catalog';
import type { AnalyzeRequest, AnalyzeResult, Margins } from '@/lib/engine/types';
import { formatSi } from '@/lib/units/si';
import { formatTolerance, PART_NAME, TOLERANCE_CONVENTION, schematicValue, type PartRow } from './parts-list';
import type { ReportBench } from './report-bench';
import { bodeSvg } from './svg-plot';
import { timeDomainSections } from './report-time-domain';
import { summarizeRange, worstCaseSentence, type RangeSummary } from '@/lib/range-summary';
import esc from 'escape-html';

export interface ReportInput {
  design: { name: string; description: string; topology: string };
  revision: { number: number; note: string; createdAt: Date; authorName: string };
  signoff: { state: SignoffState; at: Date | null; by: string | null };
  input: AnalyzeRequest;
  result: AnalyzeResult;
  /** The loop with the standard part values (what will be built); defaults to the ideal one. */
  builtBode?: AnalyzeResult['bode'];
  parts: PartRow[];
  teamName: string;
  generatedAt?: Date;
  /** Sign-off events of the revision, oldest first. */
  trail?: { state: string; actorName: string; reviewerName: string | null; message: string; at: Date }[];
  /** Remarks on the revision, oldest first. */
  remarks?: { authorName: string; body: string; at: Date; comparedWith: number | null }[];
  /** Bench data measured on the revision (and design-wide data), each against this revision's model. */
  bench?: ReportBench[];
}

const TRAIL_WORDS: Record<string, string> = {
  'in-review': 'submitted for review',
  approved: 'approved',
  'changes-requested': 'requested changes',
};

function trailSection(r: ReportInput): string {
  const trail = r.trail ?? [];
  if (trail.length === 0) return `<p class="muted">Not submitted for review yet.</p>`;
  return `<table class="grid trail" data-testid="report-trail"><thead><tr><th>When</th><th>Who</th><th>Step</th><th>Message</th></tr></thead><tbody>${trail
    .map(
      (e) =>
        `<tr><td class="nowrap">${esc(dateTime(e.at))}</td><td>${esc(e.actorName)}</td><td>${esc(TRAIL_WORDS[e.state] ?? e.state)}${
          e.state === 'in-review' && e.reviewerName ? ` — asked ${esc(e.reviewerName)}` : ''
        }</td><td class="msg">${esc(e.message || '—')}</td></tr>`,
    )
    .join('')}</tbody></table>`;
}

function remarksSection(r: ReportInput): string {
  const remarks = r.remarks ?? [];
  if (remarks.length === 0) return `<p class="muted">No remarks.</p>`;
  return `<ol class="remarks" data-testid="report-remarks">${remarks
    .map(
      (m) =>
        `<li><div class="who"><b>${esc(m.authorName)}</b> · ${esc(dateTime(m.at))}${m.comparedWith ? ` · on Compare with r${m.comparedWith}` : ''}</div><div class="msg">${esc(m.body)}</div></li>`,
    )
    .join('')}</ol>`;
}

function benchSection(r: ReportInput): string {
  const list = r.bench ?? [];
  if (list.length === 0) return `<p class="muted">No bench data attached to r${r.revision.number}.</p>`;
  return list
    .map((b, i) => {
      const row = (label: string, measured: string, model: string) => `<tr><th>${label}</th><td>${measured}</td><td>${model}</td></tr>`;
      const d = (v: number | null, unit: string) => (v === null ? '—' : `${v.toFixed(unit === 'dB' ? 2 : 1)}${unit === '°' ? '°' : ` ${unit}`}`);
      const plot = bodeSvg(b.model.bode, {
        id: `report-bench-${i}`,
        title: `Model r${r.revision.number} and bench data ${b.name}`,
        loopLabel: `Model r${r.revision.number}`,
        bench: b.points,
        crossoverHz: b.model.crossoverHz,
        width: 700,
        panelHeight: 150,
      });
      return `<div class="bench" data-testid="report-bench">
<h3>${esc(b.name)} <span class="muted small">${b.revisionNumber ? `measured on r${b.revisionNumber}` : 'design-wide'} · uploaded ${esc(date(b.createdAt))} by ${esc(b.uploaderName)}${b.phaseShifted ? ' · shown with 180° taken off (measured as −T)' : ''}</span></h3>
<table class="grid narrow"><thead><tr><th></th><th>Bench data</th><th>Model r${r.revision.number}</th></tr></thead><tbody>
${row('Crossover fc', esc(si(b.measured.crossoverHz, 'Hz')), esc(si(b.model.crossoverHz, 'Hz')))}
${row('Phase margin', esc(num(b.measured.phaseMarginDeg, '°')), esc(num(b.model.phaseMarginDeg, '°')))}
${row('Gain margin', esc(num(b.measured.gainMarginDb, 'dB')), esc(num(b.model.gainMarginDb, 'dB')))}
</tbody></table>
<p class="small">Largest difference, model minus bench, inside the model sweep: ${esc(d(b.largestGainDifferenceDb, 'dB'))}, ${esc(d(b.largestPhaseDifferenceDeg, '°'))}.</p>
<figure class="plot">${plot}</figure>
</div>`;
    })
    .join('');
}

/** The worst case across the operating range as a report section (corners and spread). */
function rangeSection(s: RangeSummary): string {
  const r = s.range;
  const rangeRows = table([
    ['Input voltage', `${r.vin.min} – ${r.vin.max} V`],
    ['Load current', `${r.iout.min} – ${r.iout.max} A`],
    ['Inductance', `±${pct(r.l.tol)}`],
    ['Capacitance', `±${pct(r.c.tol)}`],
    ['Capacitor ESR', `${si(r.rc.min, 'Ω')} – ${si(r.rc.max, 'Ω')}`],
    ['Compensator parts', r.parts ? `R ±${pct(r.parts.resistorTol)}, C ±${pct(r.parts.capacitorTol)}` : 'their series’ tolerance'],
    ['Targets', `PM ≥ ${s.targets.phaseMarginDeg}°, GM ≥ ${s.targets.gainMarginDb} dB`],
  ]);
  const p = s.spread.percentiles;
  const pr = (q: typeof p.phaseMarginDeg, unit: string) => (q ? `${num(q.p1, unit)} / ${num(q.p50, unit)} / ${num(q.p99, unit)}` : '—');
  const worst = table([
    ['Worst phase margin', s.worst.phaseMarginDeg.value === null ? (s.worst.phaseMarginDeg.corner ? `no crossover at ${s.worst.phaseMarginDeg.corner}` : '—') : `${num(s.worst.phaseMarginDeg.value, '°')} at ${s.worst.phaseMarginDeg.corner}`],
    ['Worst gain margin', s.worst.gainMarginDb.value === null ? 'no −180° crossing at any corner' : `${num(s.worst.gainMarginDb.value, 'dB')} at ${s.worst.gainMarginDb.corner}`],
    ['Crossover over the corners', `${si(s.worst.crossoverHz.min, 'Hz')} – ${si(s.worst.crossoverHz.max, 'Hz')}`],
    ['Corners in DCM', `${s.dcmCorners} of ${s.corners}`],
    ...(s.risks ?? []).map((r): [string, string] => [`Risk: ${r.id}`, `${r.count} of ${s.corners} corners, first at ${r.corner}`]),
    ['Spread PM p1 / p50 / p99', pr(p.phaseMarginDeg, '°')],
    ['Spread GM p1 / p50 / p99', pr(p.gainMarginDb, 'dB')],
    ['Builds meeting the targets', `${pct(s.spread.meetsTargets.share)} of ${formatCount(s.spread.samples)} (${s.spread.distribution}, seed ${s.spread.seed})`],
  ]);
  return `<p><b>${esc(worstCaseSentence(s))}</b></p><div class="cols"><div>${rangeRows}</div><div>${worst}</div></div><p class="muted small">Corners: every combination of the range's extremes, compensator at nominal. Spread: every part drawn within its tolerance at nominal line and load.</p>`;
}



const date = formatIsoDay;
const dateTime = formatIsoMinute;
const si = (v: number | null | undefined, unit: string, digits = 3) => (v === null || v === undefined ? '—' : formatSi(v, unit, digits));
const num = (v: number | null | undefined, unit: string, dp = 1) =>
  v === null || v === undefined ? '—' : `${v.toFixed(dp)}${unit === '°' ? '' : ' '}${unit}`;
const pct = (v: number) => `${(v * 100).toFixed(1)} %`;

function table(rows: [string, string][], cls = 'kv'): string {
  return `<table class="${cls}"><tbody>${rows.map(([k, v]) => `<tr><th>${esc(k)}</th><td>${esc(v)}</td></tr>`).join('')}</tbody></table>`;
}

function marginRows(m: Margins): [string, string][] {
  return [
    ['Crossover fc', si(m.crossoverHz, 'Hz')],
    ['Phase margin', num(m.phaseMarginDeg, '°')],
    ['Gain margin', num(m.gainMarginDb, 'dB')],
    ['Phase crossover (−180°)', si(m.phaseCrossoverHz, 'Hz')],
  ];
}

/** Error amplifier: op-amp (ideal or a0/GBW) or transconductance (gm, ro). */
const amplifierRows = (c: AnalyzeRequest['compensator']): [string, string][] => {
  if (c.amplifier === 'transconductance') {
    return [
      ['Error amplifier', AMPLIFIER_LABELS.transconductance],
      [amplifierInputLabel('gm'), si(c.gm ?? null, AMPLIFIER_INPUTS.gm.unit)],
      [amplifierInputLabel('ro'), c.ro ? si(c.ro, AMPLIFIER_INPUTS.ro.unit) : AMPLIFIER_INPUTS.ro.absentMeans],
    ];
  }
  return [['Error amplifier', c.opamp ? `Op-amp, a0 ${c.opamp.a0.toPrecision(3)}, GBW ${si(c.opamp.gbw, 'Hz')}` : 'Op-amp (ideal)']];
};

/** Landmarks of the control mode: the current-mode sampling pair (Ridley 1991) and the DCM pole. */
const modeLandmarkRows = (result: AnalyzeResult): [string, string][] => {
  const rows: [string, string][] = [];
  const m = result.modulator;
  if (m?.mode === 'peak-current') {
    if (m.samplingPoleHz !== null) rows.push(['Current-mode double pole (fsw/2)', si(m.samplingPoleHz, 'Hz')]);
    rows.push(['Qp', m.qp === null ? '—' : m.qp.toFixed(2)], ['mc = 1 + Se/Sn', m.mc.toFixed(3)]);
    if (m.samplingPoleHz !== null) rows.push(['External ramp for Qp = 1', si(m.seForQp1, 'V/s')], ['External ramp for stability', si(m.seMinStable, 'V/s')]);
  }
  if (result.dcmPoleHz !== null && result.dcmPoleHz !== undefined) rows.push(['DCM low-frequency pole', si(result.dcmPoleHz, 'Hz')]);
  return rows;
};

/** The report as a complete HTML document. */
export function buildReportHtml(r: ReportInput): string {
  const { input, result } = r;
  const cv = input.converter;
  const comp = input.compensator;
  const op = result.operatingPoint;
  const generatedAt = r.generatedAt ?? new Date();
  const title = `${r.design.name} — r${r.revision.number}`;
  const state = signoffLabel(r.signoff.state);

  const inputs = table([
    ['Topology', topologyLabel(cv.topology)],
    ['Modulator', MODULATOR_MODE_LABELS[input.modulator.mode ?? 'voltage']],
    ...STAGE_INPUTS.filter((spec) => inputApplies(spec, input)).map((spec): [string, string] => {
      const v = readInput(input, spec);
      return [inputLabel(spec), v === 0 && spec.zeroMeans ? `0 (${spec.zeroMeans})` : si(v, spec.unit)];
    }),
    ['Compensator', compensatorTitle(comp.type)],
    ...amplifierRows(comp),
    ['Resistor / capacitor series', `${result.parts.resistorSeries} / ${result.parts.capacitorSeries}`],
  ]);

  const operating = table([
    ['Duty cycle D', pct(op.duty)],
    ['Conduction', op.conduction],
    ['Load resistance', si(op.loadResistance, 'Ω')],
    ['Inductor current (average)', si(op.inductorCurrent, 'A')],
    ['Inductor ripple (p-p)', si(op.inductorRipplePp, 'A')],
    ['Inductor peak', si(op.inductorPeak, 'A')],
    ['Output ripple (p-p)', si(op.outputRipplePp, 'V')],
    ['LC resonance', si(result.plant.resonanceHz, 'Hz')],
    ['Q', result.plant.q === null ? '—' : result.plant.q.toFixed(2)],
    ['ESR zero', si(result.plant.esrZeroHz, 'Hz')],
    ['RHP zero', si(result.plant.rhpZeroHz, 'Hz')],
    ...modeLandmarkRows(result),
  ]);

  const snapped = marginRows(result.parts.snappedMargins);
  const margins = `<table class="grid"><thead><tr><th></th><th>Ideal values</th><th>Standard values</th></tr></thead><tbody>${marginRows(result.margins)
    .map(([k, v], i) => `<tr><th>${esc(k)}</th><td>${esc(v)}</td><td>${esc(snapped[i][1])}</td></tr>`)
    .join('')}</tbody></table>`;

  const parts = `<table class="grid parts"><thead><tr><th>Designator</th><th>Part</th><th>Role</th><th>Ideal</th><th>Standard</th><th>Series</th><th>Tolerance</th></tr></thead><tbody>${r.parts
    .map(
      (p) =>
        `<tr><td><b>${esc(p.designator)}</b></td><td>${esc(PART_NAME[p.part])}</td><td>${esc(p.role.replace(/^\S+ — /, ''))}</td><td>${esc(
          si(p.ideal, p.kind === 'resistor' ? 'Ω' : 'F', 4),
        )}</td><td><b>${esc(si(p.standard, p.kind === 'resistor' ? 'Ω' : 'F'))}</b> <span class="muted">(${esc(schematicValue(p.standard))})</span></td><td>${p.series}</td><td>${esc(
          formatTolerance(p.tolerancePct),
        )}</td></tr>`,
    )
    .join('')}</tbody></table><p class="muted small">${esc(TOLERANCE_CONVENTION)}</p>`;

  const checks = result.checks.length
    ? `<ul class="checks">${result.checks
        .map((c) => `<li class="check ${c.level}"><span class="level">${esc(c.level)}</span> ${esc(c.message)}</li>`)
        .join('')}</ul>`
    : '<p>No Checks raised.</p>';

  const summary = summarizeRange(input);
  const across = summary.ok ? rangeSection(summary.value) : `<p>Worst case not available: ${esc(summary.message)}</p>`;

  const cautions = `<ul class="cautions">${CAUTIONS.map((c) => `<li><b>${esc(c.title)}.</b> ${esc(c.text)}</li>`).join('')}</ul>`;

  const plot = bodeSvg(r.builtBode ?? result.bode, {
    id: 'report-bode',
    title: `Bode plot of ${title} with the standard part values`,
    parts: true,
    width: 700,
    panelHeight: 220,
    crossoverHz: r.builtBode ? result.parts.snappedMargins.crossoverHz : result.margins.crossoverHz,
  });
  const builtNote = `<p class="muted small" data-testid="report-built-note">Build with the standard values. The plot, the “Standard values” margins, the parts list and the SPICE netlist all use them; the ideal values are shown for reference only.</p>`;

  const signoffLine =
    r.signoff.at && r.signoff.state !== 'draft'
      ? `${state} — ${date(r.signoff.at)}${r.signoff.by ? ` by ${r.signoff.by}` : ''}`
      : state;

  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${esc(title)} — Phasewright report</title>
<style>
@page { margin: 14mm 12mm 16mm; }
* { box-sizing: border-box; }
body { font-family: Inter, system-ui, -apple-system, "Segoe UI", sans-serif; color: #0f172a; margin: 0 auto; max-width: 760px; padding: 24px; font-size: 12px; line-height: 1.45; -webkit-print-color-adjust: exact; print-color-adjust: exact; }
header.top { display: flex; justify-content: space-between; align-items: flex-start; border-bottom: 3px solid #312e81; padding-bottom: 10px; margin-bottom: 14px; }
header.top .brand { font-weight: 700; color: #312e81; letter-spacing: .02em; }
h1 { font-size: 20px; margin: 2px 0 4px; }
h2 { font-size: 14px; margin: 18px 0 6px; color: #312e81; border-bottom: 1px solid #e2e8f0; padding-bottom: 3px; }
.meta { text-align: right; font-size: 11px; color: #475569; }
.meta { flex: none; }
.state { display: inline-block; padding: 2px 8px; border-radius: 999px; font-weight: 600; font-size: 11px; border: 1px solid currentColor; white-space: nowrap; }
.state.approved { color: #047857; } .state.in-review { color: #4338ca; } .state.changes-requested { color: #b45309; } .state.draft { color: #475569; }
.cols { display: grid; grid-template-columns: 1fr 1fr; gap: 18px; }
table { border-collapse: collapse; width: 100%; }
table.kv th { text-align: left; font-weight: 500; color: #475569; padding: 2px 8px 2px 0; width: 55%; }
table.kv td { padding: 2px 0; font-variant-numeric: tabular-nums; }
table.grid th, table.grid td { border-bottom: 1px solid #e2e8f0; padding: 4px 6px; text-align: left; vertical-align: top; }
table.grid thead th { background: #eef2ff; color: #312e81; font-weight: 600; }
table.parts td:nth-child(3) { color: #334155; }
table.parts td:nth-child(4), table.parts td:nth-child(5), table.parts td:nth-child(7) { white-space: nowrap; }
.muted { color: #64748b; } .small { font-size: 10.5px; }
.plot svg { width: 100%; height: auto; max-height: 225mm; }
.plot { break-inside: avoid; page-break-inside: avoid; margin: 0; }
h2, h3 { break-after: avoid; page-break-after: avoid; }
h3 { font-size: 12.5px; margin: 12px 0 4px; }
table.narrow { width: auto; min-width: 60%; }
.nowrap { white-space: nowrap; }
td.msg, .remarks .msg { white-space: pre-wrap; }
ol.remarks { list-style: none; padding: 0; margin: 0; }
ol.remarks li { border: 1px solid #e2e8f0; border-radius: 4px; padding: 5px 8px; margin: 4px 0; break-inside: avoid; }
ol.remarks .who { font-size: 11px; color: #475569; }
tr { break-inside: avoid; page-break-inside: avoid; }
.bench { margin-bottom: 10px; }
ul.checks, ul.cautions { padding-left: 0; list-style: none; margin: 0; }
li.check { padding: 4px 8px; margin: 3px 0; border-left: 4px solid; background: #f8fafc; }
li.check.note { border-color: #64748b; } li.check.caution { border-color: #d97706; background: #fffbeb; } li.check.risk { border-color: #dc2626; background: #fef2f2; }
li.check .level { font-weight: 700; text-transform: uppercase; font-size: 10px; margin-right: 6px; }
ul.cautions li { margin: 4px 0; padding: 6px 8px; background: #fff7ed; border: 1px solid #fed7aa; border-radius: 4px; }
section.keep { break-inside: avoid; page-break-inside: avoid; }
footer { margin-top: 18px; border-top: 1px solid #e2e8f0; padding-top: 6px; font-size: 10.5px; color: #64748b; }
@media print { body { padding: 0; max-width: none; } a { color: inherit; text-decoration: none; } }
</style></head>
<body>
<header class="top">
  <div>
    <div class="brand">Phasewright · loop report</div>
    <h1>${esc(r.design.name)}</h1>
    <div class="muted">${esc(r.teamName)}${r.design.description ? ` · ${esc(r.design.description)}` : ''}</div>
  </div>
  <div class="meta">
    <div style="font-size:16px;font-weight:700;color:#0f172a">Revision r${r.revision.number}</div>
    <div>Saved ${esc(dateTime(r.revision.createdAt))} by ${esc(r.revision.authorName)}</div>
    <div>Sign-off: <span class="state ${esc(r.signoff.state)}" data-testid="report-signoff">${esc(signoffLine)}</span></div>
    <div>Printed ${esc(dateTime(generatedAt))}</div>
  </div>
</header>
${r.revision.note ? `<p><b>Revision note:</b> ${esc(r.revision.note)}</p>` : ''}
<section class="keep"><h2>Margins</h2>${margins}${builtNote}</section>
<section><h2>Bode plot (standard values, as built)</h2><figure class="plot">${plot}</figure></section>
<section class="cols keep">
  <div><h2>Inputs</h2>${inputs}</div>
  <div><h2>Operating point</h2>${operating}</div>
</section>
<section data-section="range"><h2>Across the operating range</h2>${across}</section>
${timeDomainSections(input, result)}
<section><h2>Parts</h2>${parts}</section>
<section><h2>Checks</h2>${checks}</section>
<section><h2>Bench data against the model</h2>${benchSection(r)}</section>
<section><h2>Sign-off trail</h2>${trailSection(r)}</section>
<section><h2>Remarks</h2>${remarksSection(r)}</section>
<section class="keep"><h2>Cautions</h2>${cautions}</section>
<footer>Small-signal averaged model at one operating point; the values above are estimates to be verified on the bench. Generated by Phasewright on ${esc(dateTime(generatedAt))}.</footer>
</body></html>
`;
}
