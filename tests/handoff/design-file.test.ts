import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createDesign, createRevision, createTeam, getDesign, getRevision, importDesign, updateDesign } from '@/db/queries';
import { memberships } from '@/db/schema';
import type { Db } from '@/db/connection';
import { analyze } from '@/lib/engine/analyze';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import type { AnalyzeRequest } from '@/lib/engine/types';
import { readDesignFile, resultsMatch } from '@/lib/handoff/design-file';
import { buildExport } from '@/lib/handoff/exports';
import { summarizeAnalysis } from '@/lib/revision-summary';
import { parseAnalyzeRequest } from '@/lib/validation/analyze';
import { tempDb } from '../support/temp-db';
import { createTestUser } from '../support/users';

let db: Db;
let cleanup: () => void;
let team: number;
let user: number;

beforeEach(() => {
  ({ db, cleanup } = tempDb());
  team = createTeam(db, { name: 'Bench team', slug: 'bench' }).id;
  user = createTestUser(db, { email: 'd@example.test', name: 'Dee', password: 'a long password' }).id;
  db.insert(memberships).values({ userId: user, teamId: team, role: 'designer' }).run();
});
afterEach(() => cleanup());

/** Save a sample as a design with one revision, as the revisions route does. */
function saveSample(request: AnalyzeRequest, name: string) {
  const parsed = parseAnalyzeRequest(request);
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.issues));
  const design = createDesign(db, user, team, { name, description: 'invented for a test', topology: request.converter.topology });
  updateDesign(db, user, team, design.id, { designatorMap: { r2: 'R17', c1: 'C42' } });
  createRevision(db, { teamId: team, designId: design.id, baseNumber: null, input: parsed.data, summary: summarizeAnalysis(analyze(parsed.data)), authorId: user, note: 'first' });
  return design.id;
}

/** Export a revision's design file as the route does. */
function exportJson(designId: number, number: number) {
  const design = getDesign(db, team, designId)!;
  const rev = getRevision(db, designId, number)!;
  const input = rev.input as AnalyzeRequest;
  return buildExport('json', {
    design,
    revision: { ...rev, input },
    signoff: { state: 'draft', at: null, by: null },
    result: analyze(input),
    teamName: 'Bench team',
  });
}

describe('design file round trip', () => {
  for (const sample of SAMPLE_DESIGNS) {
    it(`export → import → identical analysis: ${sample.key}`, () => {
      const id = saveSample(sample.request, sample.name);
      const file = exportJson(id, 1);
      expect(file.fileName).toMatch(/-r1\.json$/);
      expect(file.contentType).toMatch(/^application\/json/);
      const parsed = JSON.parse(file.body);
      expect(parsed.format).toBe('phasewright-design');
      expect(parsed.version).toBe(1);

      const read = readDesignFile(parsed);
      if (!read.ok) throw new Error(JSON.stringify(read.issues));
      const result = analyze(read.input);
      expect(resultsMatch(read.file.results, result.margins)).toBe(true);
      const imported = importDesign(db, user, team, {
        ...read.file.design,
        description: read.file.design.description ?? '',
        input: read.input,
        summary: summarizeAnalysis(result),
        note: 'imported',
      });
      expect(imported.revision).toBe(1);
      const copy = getDesign(db, team, imported.designId)!;
      expect(copy.id).not.toBe(id);
      expect(copy.name).toBe(sample.name);
      expect(copy.topology).toBe(sample.request.converter.topology);
      expect(copy.designatorMap).toEqual({ r2: 'R17', c1: 'C42' });

      const original = getRevision(db, id, 1)!;
      const again = getRevision(db, imported.designId, 1)!;
      expect(again.input).toEqual(original.input);
      expect(analyze(again.input as AnalyzeRequest)).toEqual(analyze(original.input as AnalyzeRequest));
      expect(again.summary).toEqual(original.summary);
      // And a second export of the copy is the same file but for the date.
      const second = JSON.parse(exportJson(imported.designId, 1).body);
      expect({ ...second, exportedAt: 0, revision: { ...second.revision, savedAt: 0, note: '' } }).toEqual({
        ...parsed,
        exportedAt: 0,
        revision: { ...parsed.revision, savedAt: 0, note: '' },
      });
    });
  }
});

describe('reading design files', () => {
  const valid = () => JSON.parse(exportJson(saveSample(SAMPLE_DESIGNS[0].request, 'x'), 1).body);

  it('refuses another format, a newer version and a broken input, naming the field', () => {
    const a = readDesignFile({ ...valid(), format: 'something-else' });
    expect(a.ok).toBe(false);
    expect(!a.ok && a.issues[0]).toMatchObject({ path: 'format' });
    const b = readDesignFile({ ...valid(), version: 2 });
    expect(!b.ok && b.issues[0].message).toMatch(/newer Phasewright/);
    const file = valid();
    file.input.converter.l = 'ten microhenry';
    const c = readDesignFile(file);
    expect(!c.ok && c.issues[0]).toMatchObject({ path: 'input.converter.l', message: 'Inductance L (l) must be a number' });
    expect(readDesignFile(null).ok).toBe(false);
  });

  it('refuses a design whose topology contradicts its input', () => {
    const file = valid();
    file.design.topology = 'boost';
    const r = readDesignFile(file);
    expect(!r.ok && r.issues[0].path).toBe('input.converter.topology');
  });

  it('refuses a bad designator in the mapping', () => {
    const file = valid();
    file.design.designatorMap = { r2: 'not a designator!' };
    expect(readDesignFile(file).ok).toBe(false);
  });

  it('tells when stored results differ from a re-analysis', () => {
    const m = analyze(SAMPLE_DESIGNS[0].request).margins;
    expect(resultsMatch({ crossoverHz: m.crossoverHz, phaseMarginDeg: m.phaseMarginDeg, gainMarginDb: m.gainMarginDb }, m)).toBe(true);
    expect(resultsMatch({ crossoverHz: m.crossoverHz! * 1.01 }, m)).toBe(false);
    expect(resultsMatch({ gainMarginDb: null }, { ...m, gainMarginDb: 12 })).toBe(false);
    expect(resultsMatch(undefined, m)).toBe(true);
  });
});
