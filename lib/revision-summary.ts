import type { AnalyzeResult } from '@/lib/engine/types';

/** What a revision stores of its analysis: everything but the Bode arrays. */
export function summarizeAnalysis(r: AnalyzeResult) {
  const { bode: _bode, ...rest } = r;
  return rest;
}

export type RevisionSummary = ReturnType<typeof summarizeAnalysis>;
