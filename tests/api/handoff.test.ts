/**
 * Issue 6: Handoff and bench data over HTTP. Exports per format with their file names,
 * roles (viewer exports but neither uploads nor imports), 401 without a session, 404 across
 * teams; the exported .cir run by ngspice against /api/analyze; the design file round trip
 * through import; bench data upload (multipart and text), a bad file naming its line with
 * nothing stored, 413, the 180° shift and delete.
 */
import { beforeAll, describe, expect, inject, it } from 'vitest';
import type { AnalyzeRequest } from '@/lib/engine/types';
import { benchCsvFor } from '../support/bench-file';
import { Client, signedInAs } from '../support/http';
import { ngspiceAvailable, readNgspiceTable, runNgspice } from '../support/ngspice';
import { otherTeam } from '../support/other-team';
import { savedDesign } from '../support/saved-design';

const baseUrl = inject('baseUrl');
const dbPath = inject('dbPath');
const ROLES = ['admin', 'designer', 'reviewer', 'viewer'] as const;
const clients = {} as Record<(typeof ROLES)[number], Client>;
const NAME = 'Handoff test: 5 V rail, motor board';
const SLUG = 'handoff-test-5-v-rail-motor-board';
let designId: number;
let input: AnalyzeRequest;
let outsider: Awaited<ReturnType<typeof otherTeam>>;

beforeAll(async () => {
  for (const role of ROLES) clients[role] = await signedInAs(baseUrl, role);
  outsider = await otherTeam(baseUrl, dbPath);
  const saved = await savedDesign(clients.designer, NAME);
  designId = saved.designId;
  input = saved.input as unknown as AnalyzeRequest;
});

const exportUrl = (format: string, rev = 1, id = designId) => `/api/designs/${id}/revisions/${rev}/export?format=${format}`;

function upload(client: Client, body: string | Uint8Array, opts: { name?: string; fileName?: string; phaseShifted?: boolean; revision?: string } = {}) {
  const form = new FormData();
  form.set('file', new Blob([body as BlobPart], { type: 'text/csv' }), opts.fileName ?? 'loop.csv');
  if (opts.revision) form.set('revision', opts.revision);
  if (opts.name) form.set('name', opts.name);
  if (opts.phaseShifted) form.set('phaseShifted', 'true');
  return client.fetch(`/api/designs/${designId}/bench`, { method: 'POST', body: form });
}

const benchCount = async () => (await (await clients.viewer.fetch(`/api/designs/${designId}/bench`)).json()).benchData.length as number;

describe('GET …/revisions/[n]/export', () => {
  const EXPECT = [
    ['csv', 'text/csv', `${SLUG}-r1-parts.csv`],
    ['json', 'application/json', `${SLUG}-r1.json`],
    ['spice', 'text/plain', `${SLUG}-r1.cir`],
    ['report', 'text/html', `${SLUG}-r1-report.html`],
  ] as const;

  it.each(EXPECT)('%s: content type and file name', async (format, type, file) => {
    const res = await clients.designer.fetch(exportUrl(format));
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toContain(type);
    expect(res.headers.get('content-disposition')).toMatch(new RegExp(`^attachment; filename="${file.replace(/\./g, '\\.')}"`));
    expect((await res.text()).length).toBeGreaterThan(100);
  });

  it.each(ROLES)('%s may export', async (role) => {
    expect((await clients[role].fetch(exportUrl('csv'))).status).toBe(200);
  });

  it('report: inline on request, cautions, revision and sign-off state, locked down by CSP', async () => {
    const res = await clients.viewer.fetch(exportUrl('report') + '&inline=1');
    expect(res.headers.get('content-disposition')).toMatch(/^inline;/);
    expect(res.headers.get('content-security-policy')).toContain("default-src 'none'");
    const html = await res.text();
    expect(html).toContain('Revision r1');
    expect(html).toContain('Hazardous voltages');
    expect(html).toContain('Verify on the bench');
    expect(html).toMatch(/data-testid="report-signoff">Draft</);
    expect(html).toContain('<svg');
  });

  it('csv: uses the designators saved with the design', async () => {
    const patch = await clients.designer.json(`/api/designs/${designId}`, 'PATCH', { designatorMap: { r2: 'R17', c1: 'C42' } });
    expect(patch.status).toBe(200);
    const csv = await (await clients.viewer.fetch(exportUrl('csv'))).text();
    const lines = csv.trim().split('\r\n');
    expect(lines[0]).toBe('Reference designator,Part,Role,Ideal value,Standard value,Unit,Series,Tolerance,Standard value (base unit)');
    expect(lines.some((l) => l.startsWith('R17,R2,R2 — sets the mid-band gain'))).toBe(true);
    expect(lines.some((l) => l.startsWith('C42,C1,'))).toBe(true);
    const bad = await clients.designer.json(`/api/designs/${designId}`, 'PATCH', { designatorMap: { r2: 'not one' } });
    expect(bad.status).toBe(400);
    expect((await bad.json()).issues[0].path).toBe('designatorMap.r2');
  });

  it('400 for an unknown format, 404 for a missing revision or another team, 401 without a session', async () => {
    const bad = await clients.viewer.fetch(exportUrl('pdf'));
    expect(bad.status).toBe(400);
    expect((await bad.json()).issues[0].path).toBe('format');
    expect((await clients.viewer.fetch(exportUrl('csv', 99))).status).toBe(404);
    expect((await clients.viewer.fetch(exportUrl('csv', 1, outsider.designId))).status).toBe(404);
    expect((await new Client(baseUrl).fetch(exportUrl('csv'))).status).toBe(401);
  });
});

describe.skipIf(!ngspiceAvailable())('exported .cir in ngspice against /api/analyze', () => {
  it('agrees within 0.1 dB and 1°', async () => {
    const cir = await (await clients.viewer.fetch(exportUrl('spice'))).text();
    const rows = readNgspiceTable(runNgspice(cir, `${SLUG}-r1.cir`), ['frequency', 'loopdb', 'loopdeg']);
    expect(rows.length).toBeGreaterThan(50);
    // The engine at exactly ngspice's frequencies: one analysis per row would be slow, so a
    // dense sweep of the same band, interpolated in log f.
    const fStop = input.converter.fsw / 2;
    const res = await clients.viewer.json('/api/analyze', 'POST', { ...input, sweep: { fStart: 10, fStop, points: 8000 } });
    expect(res.status).toBe(200);
    const { bode } = await res.json();
    const at = (ys: number[], f: number) => {
      let k = bode.f.findIndex((x: number) => x >= f);
      if (k <= 0) k = 1;
      const t = Math.log(f / bode.f[k - 1]) / Math.log(bode.f[k] / bode.f[k - 1]);
      return ys[k - 1] + t * (ys[k] - ys[k - 1]);
    };
    for (const [f, db, deg] of rows) {
      expect(Math.abs(db - at(bode.loop.magDb, f))).toBeLessThan(0.1);
      const d = ((((deg - at(bode.loop.phaseDeg, f)) % 360) + 540) % 360) - 180;
      expect(Math.abs(d)).toBeLessThan(1);
    }
  });
});

describe('POST /api/designs/import', () => {
  it('designer: the exported design file becomes a new design with the same input and margins', async () => {
    const file = await (await clients.designer.fetch(exportUrl('json'))).text();
    const res = await clients.designer.fetch('/api/designs/import', { method: 'POST', headers: { 'content-type': 'application/json' }, body: file });
    expect(res.status).toBe(201);
    const created = await res.json();
    expect(created).toMatchObject({ revision: 1, name: NAME, resultsMatch: true });
    expect(created.id).not.toBe(designId);
    const copy = await (await clients.viewer.fetch(`/api/designs/${created.id}`)).json();
    expect(copy.designatorMap).toEqual({ r2: 'R17', c1: 'C42' });
    const a = await (await clients.viewer.fetch(`/api/designs/${designId}/revisions/1`)).json();
    const b = await (await clients.viewer.fetch(`/api/designs/${created.id}/revisions/1`)).json();
    expect(b.input).toEqual(a.input);
    expect(b.summary).toEqual(a.summary);
  });

  it('viewer and reviewer may not import (403); 401 without a session', async () => {
    const file = await (await clients.viewer.fetch(exportUrl('json'))).text();
    for (const role of ['viewer', 'reviewer'] as const)
      expect((await clients[role].fetch('/api/designs/import', { method: 'POST', headers: { 'content-type': 'application/json' }, body: file })).status).toBe(403);
    expect((await new Client(baseUrl).fetch('/api/designs/import', { method: 'POST', headers: { 'content-type': 'application/json' }, body: file })).status).toBe(401);
  });

  it('400 for broken JSON or another format, naming the field', async () => {
    const broken = await clients.designer.fetch('/api/designs/import', { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{"format":' });
    expect(broken.status).toBe(400);
    const other = await clients.designer.json('/api/designs/import', 'POST', { format: 'something', version: 1 });
    expect(other.status).toBe(400);
    expect((await other.json()).issues.map((i: { path: string }) => i.path)).toContain('format');
  });
});

describe('bench data', () => {
  it('designer uploads a measured loop (multipart); everyone reads it with measured margins', async () => {
    const before = await benchCount();
    const res = await upload(clients.designer, benchCsvFor(input, { gainOffsetDb: -1, phaseOffsetDeg: -3 }), { fileName: 'bench-run-1.csv' });
    expect(res.status).toBe(201);
    const up = await res.json();
    expect(up).toMatchObject({ name: 'bench-run-1.csv', rows: 120, looksInverted: false, phaseShifted: false, frequencyUnit: 'Hz' });
    expect(await benchCount()).toBe(before + 1);

    const detail = await (await clients.viewer.fetch(`/api/designs/${designId}/bench/${up.id}?revision=1`)).json();
    expect(detail.points.f).toHaveLength(120);
    expect(detail.model.crossoverHz).toBeGreaterThan(0);
    // 1 dB less gain moves fc down a little; 3° less phase lowers PM by about 3°.
    expect(detail.measured.crossoverHz).toBeLessThan(detail.model.crossoverHz);
    expect(detail.measured.crossoverHz).toBeGreaterThan(detail.model.crossoverHz * 0.7);
    expect(Math.abs(detail.largestGainDifferenceDb - 1)).toBeLessThan(0.05);
    expect(Math.abs(detail.largestPhaseDifferenceDeg - 3)).toBeLessThan(0.2);
  });

  it('takes a raw text body with the name in the query', async () => {
    const res = await clients.admin.fetch(`/api/designs/${designId}/bench?name=${encodeURIComponent('Run 2 (kHz)')}&frequencyUnit=kHz`, {
      method: 'POST',
      headers: { 'content-type': 'text/csv' },
      body: 'frequency;gain;phase\n0,1;40;-91\n1;20;-100\n10;0,5;-130\n100;-20;-170\n',
    });
    expect(res.status).toBe(201);
    const up = await res.json();
    expect(up).toMatchObject({ name: 'Run 2 (kHz)', rows: 4, frequencyUnit: 'kHz' });
    const detail = await (await clients.viewer.fetch(`/api/designs/${designId}/bench/${up.id}`)).json();
    expect(detail.points.f).toEqual([100, 1000, 10000, 100000]);
    expect(detail.points.gainDb[2]).toBe(0.5);
  });

  it('a bad file answers 422 naming the line, and nothing is stored', async () => {
    const before = await benchCount();
    const res = await upload(clients.designer, 'Frequency (Hz),Gain (dB),Phase (deg)\n100,40,-90\n1000,NaN,-100\n');
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.error).toBe('The bench data was not stored: line 3: gain "NaN" is not a number');
    expect(body.issues).toEqual([{ path: 'line 3', message: 'gain "NaN" is not a number' }]);
    expect(body.line).toBe(3);
    const unsorted = await upload(clients.designer, 'f (Hz),gain (dB),phase (deg)\n100,40,-90\n1000,20,-100\n500,10,-110\n');
    expect((await unsorted.json()).error).toMatch(/line 4: frequency 500 Hz is below 1000 Hz on line 3/);
    const empty = await upload(clients.designer, '');
    expect(empty.status).toBe(422);
    const binary = await upload(clients.designer, new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x00, 0x00, 0x1a]));
    expect((await binary.json()).error).toMatch(/binary/);
    expect(await benchCount()).toBe(before);
  });

  it('413 for a file over 10 MB, nothing stored', async () => {
    const before = await benchCount();
    const big = new Uint8Array(10 * 1024 * 1024 + 10).fill(0x31);
    const res = await upload(clients.designer, big);
    expect(res.status).toBe(413);
    const raw = await clients.designer.fetch(`/api/designs/${designId}/bench`, { method: 'POST', headers: { 'content-type': 'text/plain' }, body: big });
    expect(raw.status).toBe(413);
    expect(await benchCount()).toBe(before);
  });

  it('data measured as −T is flagged; the 180° shift gives the measured margins', async () => {
    const res = await upload(clients.designer, benchCsvFor(input, { invert: true }), { name: 'inverted injection' });
    const up = await res.json();
    expect(up.looksInverted).toBe(true);
    expect(up.lowFrequencyPhaseDeg).toBeGreaterThan(45);
    const url = `/api/designs/${designId}/bench/${up.id}?revision=1`;
    const shift = await clients.designer.json(`/api/designs/${designId}/bench/${up.id}`, 'PATCH', { phaseShifted: true });
    expect(shift.status).toBe(200);
    const detail = await (await clients.viewer.fetch(url)).json();
    expect(detail.phaseShifted).toBe(true);
    expect(detail.looksInverted).toBe(true); // of the data as uploaded
    expect(Math.abs(detail.measured.phaseMarginDeg - detail.model.phaseMarginDeg)).toBeLessThan(1);
    expect(detail.largestPhaseDifferenceDeg).toBeLessThan(0.5);
  });

  it('roles: viewer and reviewer read but may not upload, shift or delete (403); 401 without a session', async () => {
    const list = await (await clients.viewer.fetch(`/api/designs/${designId}/bench`)).json();
    const id = list.benchData[0].id;
    for (const role of ['viewer', 'reviewer'] as const) {
      expect((await upload(clients[role], benchCsvFor(input))).status).toBe(403);
      expect((await clients[role].json(`/api/designs/${designId}/bench/${id}`, 'PATCH', { phaseShifted: true })).status).toBe(403);
      expect((await clients[role].fetch(`/api/designs/${designId}/bench/${id}`, { method: 'DELETE' })).status).toBe(403);
      expect((await clients[role].fetch(`/api/designs/${designId}/bench/${id}`)).status).toBe(200);
    }
    const anon = new Client(baseUrl);
    expect((await anon.fetch(`/api/designs/${designId}/bench`)).status).toBe(401);
    expect((await upload(anon, benchCsvFor(input))).status).toBe(401);
    expect((await outsider.client.fetch(`/api/designs/${designId}/bench/${id}`)).status).toBe(404);
  });

  it('bench data belongs to a revision: the latest by default, or the one named; listed per revision', async () => {
    const r2 = await clients.designer.json(`/api/designs/${designId}/revisions`, 'POST', { baseRevision: 1, note: 'bench r2', input });
    expect(r2.status).toBe(201);
    const onLatest = await upload(clients.designer, benchCsvFor(input), { name: 'board B' });
    expect(onLatest.status).toBe(201);
    expect((await onLatest.json()).revision).toBe(2);
    const onFirst = await upload(clients.designer, benchCsvFor(input), { name: 'board A', revision: '1' });
    expect((await onFirst.json()).revision).toBe(1);
    const names = async (q: string) =>
      ((await (await clients.viewer.fetch(`/api/designs/${designId}/bench${q}`)).json()).benchData as { name: string; revisionNumber: number }[]).map((b) => `${b.name}@r${b.revisionNumber}`);
    expect(await names('?revision=2')).toContain('board B@r2');
    expect(await names('?revision=2')).not.toContain('board A@r1');
    expect(await names('?revision=1')).toContain('board A@r1');
    expect(await names('')).toEqual(expect.arrayContaining(['board A@r1', 'board B@r2']));
    const bad = await upload(clients.designer, benchCsvFor(input), { revision: '99' });
    expect(bad.status).toBe(422);
    expect((await bad.json()).issues[0].path).toBe('revision');
  });

  it('designer deletes one; it is gone', async () => {
    const list = await (await clients.viewer.fetch(`/api/designs/${designId}/bench`)).json();
    const id = list.benchData[0].id;
    const res = await clients.designer.fetch(`/api/designs/${designId}/bench/${id}`, { method: 'DELETE' });
    expect(res.status).toBe(204);
    expect((await clients.viewer.fetch(`/api/designs/${designId}/bench/${id}`)).status).toBe(404);
    expect((await clients.designer.fetch(`/api/designs/${designId}/bench/${id}`, { method: 'DELETE' })).status).toBe(404);
  });
});
