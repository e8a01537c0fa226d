import { describe, expect, it } from 'vitest';
import { CAUTIONS } from '@/lib/cautions';
import { analyze } from '@/lib/engine/analyze';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import { buildExport, type ExportContext } from '@/lib/handoff/exports';
import { contentDisposition, exportFileName, slugify } from '@/lib/handoff/files';
import { bodeSvg, differenceSvg } from '@/lib/handoff/svg-plot';

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
    for (const c of ctx().result.checks) expect(html).toContain(c.message.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;'));
  });

  it('shows every caution', () => {
    for (const c of CAUTIONS) expect(html).toContain(c.title);
  });

  it('draws the Bode plots as inline SVG', () => {
    expect(html).toMatch(/<svg[^>]+role="img"/);
    expect((html.match(/<polyline/g) ?? []).length).toBe(6); // loop, stage, compensator × 2 panels
  });

  it('escapes names', () => {
    expect(html).toContain('Motor board &lt;5 V&gt; rail');
    expect(html).not.toContain('<5 V>');
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
