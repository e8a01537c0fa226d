import escapeHtml from 'escape-html';
import { describe, expect, it } from 'vitest';
import { CAUTIONS } from '@/lib/cautions';
import { analyze } from '@/lib/engine/analyze';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import { buildExport, type ExportContext } from '@/lib/handoff/exports';
import { contentDisposition, exportFileName, slugify } from '@/lib/handoff/files';
import { bodeSvg, differenceSvg } from '@/lib/handoff/svg-plot';
import { benchForReport } from '@/lib/handoff/report-bench';

const sample = SAMPLE_DESIGNS[0];
const ctx = (over: Partial<ExportContext> = {}): ExportContext => ({
  design: { name: 'Motor board <5 V> rail', description: 'invented & tested', topology: 'buck', designatorMap: { r2: 'R17' } },
  revision: { number: 3, note: 'snapped C2', createdAt: new Date('2026-02-03T10:20:00Z'), authorName: 'Dara Designer', input: sample.request },
  signoff: { state: 'approved', at: new Date('2026-02-04T09:00:00Z'), by: 'Rui Reviewer' },
  result: analyze(sample.request),
  teamName: 'Northwind',
  now: new Date('2026-02-05T08:00:00Z'),
  ...over,
});

describe('printable report', () => {
  const html = buildExport('report', ctx()).body;

  it('states the worst case across the operating range and the spread', () => {
    expect(html).toContain('<h2>Across the operating range</h2>');
    expect(html).toMatch(/Worst case over 32 corners: PM \d+\.\d° at (low|high) line/);
    expect(html).toContain('Builds meeting the targets');
    expect(html).toContain('Spread PM p1 / p50 / p99');
  });

  it('is one self-contained HTML page with print styles and no script', () => {
    expect(html.startsWith('<!doctype html>')).toBe(true);
    expect(html).toContain('@page');
    expect(html).toContain('@media print');
    expect(html).not.toMatch(/<script|<link|src="http/);
  });

  it('shows revision, sign-off state and date, inputs, operating point, margins, parts, Checks', () => {
    expect(html).toContain('Revision r3');
    expect(html).toContain('Approved — 2026-02-04 by Rui Reviewer');
    expect(html).toContain('Saved 2026-02-03 10:20 UTC by Dara Designer');
    expect(html).toContain('Printed 2026-02-05 08:00 UTC');
    expect(html).toContain('Input voltage Vin</th><td>24 V');
    expect(html).toContain('Duty cycle D');
    expect(html).toContain('Phase margin');
    expect(html).toContain('<b>R17</b>');
    for (const c of ctx().result.checks) expect(html).toContain(escapeHtml(c.message));
  });

  it('shows every caution', () => {
    for (const c of CAUTIONS) expect(html).toContain(c.title);
  });

  it('draws the Bode plots as inline SVG', () => {
    expect(html).toMatch(/<svg[^>]+role="img"/);
    // Bode: loop, stage, compensator × 2 panels; switching check: the model's loop × 2 panels.
    expect((html.match(/<polyline/g) ?? []).length).toBe(8);
  });

  it('includes the step response and the switching check of the model', () => {
    expect(html).toContain('<h2>Step response</h2>');
    expect(html).toMatch(/Peak deviation<\/th><td>−\d/);
    expect(html).toContain('aria-label="Step response: load 1.5 → 3 A');
    expect(html).toContain('<h2>Switching check of the model</h2>');
    expect((html.match(/<tr><td>[\d.]+ kHz<\/td><td>/g) ?? []).length).toBeGreaterThanOrEqual(5);
  });

  it('escapes names', () => {
    expect(html).toContain('Motor board &lt;5 V&gt; rail');
    expect(html).not.toContain('<5 V>');
  });

  it('plots the loop as built (standard values) and says that every export uses them', () => {
    expect(html).toContain('Bode plot (standard values, as built)');
    expect(html).toMatch(/data-testid="report-built-note">Build with the standard values\./);
  });

  it('says draft without a date for a draft', () => {
    const d = buildExport('report', ctx({ signoff: { state: 'draft', at: null, by: null } })).body;
    expect(d).toMatch(/data-testid="report-signoff">Draft</);
  });
});

describe('export file names', () => {
  it('use the design slug and revision', () => {
    expect(slugify('5 V rail, motor board')).toBe('5-v-rail-motor-board');
    expect(slugify('−12 V bias (Über)')).toBe('12-v-bias-uber');
    expect(slugify('***')).toBe('design');
    expect(exportFileName('Motor board', 3, 'csv')).toBe('motor-board-r3-parts.csv');
    expect(exportFileName('Motor board', 3, 'json')).toBe('motor-board-r3.json');
    expect(exportFileName('Motor board', 3, 'spice')).toBe('motor-board-r3.cir');
    expect(exportFileName('Motor board', 3, 'report')).toBe('motor-board-r3-report.html');
    expect(contentDisposition('a-r1.cir')).toBe(`attachment; filename="a-r1.cir"; filename*=UTF-8''a-r1.cir`);
  });
});

describe('SVG plots', () => {
  it('draw bench data as grey dots and thin a long sweep', () => {
    const r = analyze(sample.request);
    const n = 5000;
    const bench = {
      f: Array.from({ length: n }, (_, k) => 10 * 1e4 ** (k / (n - 1))),
      gainDb: Array.from({ length: n }, () => 0),
      phaseDeg: Array.from({ length: n }, () => -120),
    };
    const svg = bodeSvg(r.bode, { id: 't', title: 'x', bench });
    const dots = (svg.match(/r="2.2"/g) ?? []).length;
    expect(dots).toBeGreaterThan(400);
    expect(dots).toBeLessThanOrEqual(2 * 800);
    expect(svg).toContain('fill="#6b7280"');
    expect(differenceSvg(bench, { id: 'd', title: 'diff' })).toContain('Δ phase');
  });
});

describe('report: review and bench', () => {
  const benchPoints = (() => {
    const m = analyze({ ...sample.request, sweep: { fStart: 100, fStop: 200e3, points: 60 } }).bode;
    return { f: m.f, gainDb: m.loop.magDb.map((x) => x - 1), phaseDeg: m.loop.phaseDeg.map((x) => x - 3) };
  })();
  const full = buildExport(
    'report',
    ctx({
      trail: [
        { state: 'in-review', actorName: 'Dara Designer', reviewerName: 'Rui Reviewer', message: 'Please check PM', at: new Date('2026-02-03T11:00:00Z') },
        { state: 'approved', actorName: 'Rui Reviewer', reviewerName: null, message: 'Good for the pilot run', at: new Date('2026-02-04T09:00:00Z') },
      ],
      remarks: [{ authorName: 'Rui Reviewer', body: 'Zero moved <closer> to fc', at: new Date('2026-02-03T12:00:00Z'), comparedWith: 2 }],
      bench: [
        benchForReport(sample.request, {
          name: 'Board 1, 24 V in',
          uploaderName: 'Dara Designer',
          createdAt: new Date('2026-02-04T08:00:00Z'),
          revisionNumber: 3,
          phaseShifted: false,
          points: benchPoints,
        }),
      ],
    }),
  ).body;

  it('shows the sign-off trail in order with who asked whom', () => {
    expect(full).toContain('data-testid="report-trail"');
    expect(full).toMatch(/Dara Designer<\/td><td>submitted for review — asked Rui Reviewer<\/td><td class="msg">Please check PM/);
    expect(full.indexOf('submitted for review')).toBeLessThan(full.indexOf('Good for the pilot run'));
  });

  it('shows the remarks, escaped, with the comparison they were written on', () => {
    expect(full).toContain('Zero moved &lt;closer&gt; to fc');
    expect(full).toContain('on Compare with r2');
  });

  it('shows each bench data set against the model: margins side by side, differences, and an overlay plot', () => {
    expect(full).toContain('data-testid="report-bench"');
    expect(full).toContain('Board 1, 24 V in');
    expect(full).toContain('measured on r3');
    expect(full).toMatch(/<th>Bench data<\/th><th>Model r3<\/th>/);
    // Bench gain 1 dB below the model everywhere → the largest gain difference is 1 dB.
    // (the phase difference is read between model samples: 3° within 0.1°)
    expect(full).toMatch(/Largest difference, model minus bench, inside the model sweep: 1\.00 dB, 3\.[01]°\./);
    // The Bode plot and the bench overlay, besides the time-domain section's plots.
    const timeDomain = full.indexOf('<section data-section="range">');
    const benchAt = full.indexOf('data-testid="report-bench"');
    expect((full.slice(0, timeDomain).match(/<svg/g) ?? []).length).toBe(1);
    expect((full.slice(benchAt).match(/<svg/g) ?? []).length).toBe(1);
  });

  it('says so when a revision has no bench data, trail or remarks', () => {
    const html = buildExport('report', ctx()).body;
    expect(html).toContain('No bench data attached to r3.');
    expect(html).toContain('Not submitted for review yet.');
    expect(html).toContain('No remarks.');
  });

  it('prints on any paper: no fixed page size; the badge never wraps; plots no taller than a page', () => {
    expect(full).toMatch(/@page \{ margin:/);
    expect(full).not.toMatch(/@page \{[^}]*size:/);
    expect(full).toMatch(/\.state \{[^}]*white-space: nowrap/);
    expect(full).toMatch(/\.plot svg \{[^}]*max-height/);
  });
});
