import { analyze } from '@/lib/engine/analyze';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import { summarizeAnalysis } from '@/lib/revision-summary';

/** A real revision body (the first sample design) for query tests that need one. */
export function sampleRevisionBody() {
  const input = SAMPLE_DESIGNS[0].request;
  return { input, summary: summarizeAnalysis(analyze(input)) };
}
