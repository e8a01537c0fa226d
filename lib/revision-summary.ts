import type { AnalyzeResult } from '@/lib/engine/types';

/** What a revision stores of its analysis: everything but the Bode arrays. */
export function summarizeAnalysis(r: AnalyzeResult) {
  const { bode: _bode, ...rest } = r;
  return rest;
}

export type RevisionSummary = ReturnType<typeof summarizeAnalysis>;

/** The answer to saving a revision: its number, base and the summary the server computed. */
export function savedRevisionBody(
  row: { id: number; number: number; baseNumber: number | null; note: string; createdAt: Date },
  summary: RevisionSummary,
) {
  return { id: row.id, number: row.number, baseRevision: row.baseNumber, note: row.note, createdAt: row.createdAt, summary };
}

export type SavedRevisionBody = ReturnType<typeof savedRevisionBody>;
