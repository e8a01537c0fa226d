/**
 * The design file: a revision's full analysis request with the design's name, description,
 * topology and designator mapping, in our own JSON format
 * `{ format: "phasewright-design", version: 1, … }`. Importing it creates a new design whose
 * first revision holds the same request, so the analysis is identical. `results` carries the
 * exported crossover and margins so an import can confirm it reproduced them.
 */
import type { AnalyzeRequest, AnalyzeResult, Topology } from '@/lib/engine/types';
import { zodIssues } from '@/lib/validation/analyze';
import { DESIGN_FILE_FORMAT, DESIGN_FILE_VERSION, designFileSchema, type DesignFileInput } from '@/lib/validation/design-file';
import type { FieldIssue } from '@/lib/engine/types';

export interface DesignFile {
  format: typeof DESIGN_FILE_FORMAT;
  version: typeof DESIGN_FILE_VERSION;
  exportedAt: string;
  design: { name: string; description: string; topology: Topology; designatorMap: Record<string, string> };
  revision: { number: number; note: string; savedAt: string };
  input: AnalyzeRequest;
  results: { crossoverHz: number | null; phaseMarginDeg: number | null; gainMarginDb: number | null };
}

export function buildDesignFile(args: {
  design: { name: string; description: string; topology: Topology; designatorMap: Record<string, string> };
  revision: { number: number; note: string; createdAt: Date; input: AnalyzeRequest };
  result: Pick<AnalyzeResult, 'margins'>;
  now?: Date;
}): DesignFile {
  const { design, revision, result } = args;
  return {
    format: DESIGN_FILE_FORMAT,
    version: DESIGN_FILE_VERSION,
    exportedAt: (args.now ?? new Date()).toISOString(),
    design: {
      name: design.name,
      description: design.description,
      topology: design.topology,
      designatorMap: { ...design.designatorMap },
    },
    revision: { number: revision.number, note: revision.note, savedAt: revision.createdAt.toISOString() },
    input: revision.input,
    results: {
      crossoverHz: result.margins.crossoverHz,
      phaseMarginDeg: result.margins.phaseMarginDeg,
      gainMarginDb: result.margins.gainMarginDb,
    },
  };
}

/** Pretty JSON with a final newline, as written to disk. */
export const designFileJson = (file: DesignFile) => JSON.stringify(file, null, 2) + '\n';

export type ReadDesignFile =
  | { ok: true; file: DesignFileInput; input: AnalyzeRequest }
  | { ok: false; error: string; issues: FieldIssue[] };

/** Check a parsed design file; the topology of the design and of its input must agree. */
export function readDesignFile(body: unknown): ReadDesignFile {
  const r = designFileSchema.safeParse(body);
  if (!r.success) return { ok: false, error: 'The file is not a Phasewright design file this version can read', issues: zodIssues(r.error) };
  const file = r.data;
  if (file.design.topology !== file.input.converter.topology)
    return {
      ok: false,
      error: 'The design file contradicts itself',
      issues: [{ path: 'input.converter.topology', message: `the design is a ${file.design.topology} but its input is a ${file.input.converter.topology}` }],
    };
  return { ok: true, file, input: file.input };
}

/**
 * Whether a re-analysis reproduces the results stored in a file (1e-9 relative on fc,
 * 1e-6° on PM, 1e-6 dB on GM; null must stay null). Files without results pass.
 */
export function resultsMatch(stored: DesignFileInput['results'], margins: AnalyzeResult['margins']): boolean {
  if (!stored) return true;
  const same = (a: number | null | undefined, b: number | null, tol: (x: number) => number) =>
    a === undefined || (a === null ? b === null : b !== null && Math.abs(a - b) <= tol(a));
  return (
    same(stored.crossoverHz, margins.crossoverHz, (x) => Math.abs(x) * 1e-9) &&
    same(stored.phaseMarginDeg, margins.phaseMarginDeg, () => 1e-6) &&
    same(stored.gainMarginDb, margins.gainMarginDb, () => 1e-6)
  );
}
