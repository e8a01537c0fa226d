/**
 * Runs the tolerance spread off the page's thread. Messages: in { request, range, options };
 * out { type: 'progress', done, total } every few hundred samples, then { type: 'done', result,
 * elapsedMs } or { type: 'error', message, issues }. Cancelling terminates the worker.
 */
import { runSpread, type SpreadOptions } from '@/lib/engine/spread';
import type { OperatingRange } from '@/lib/engine/range';
import { EngineInputError, type AnalyzeRequest } from '@/lib/engine/types';

export interface SpreadJob {
  request: AnalyzeRequest;
  range: OperatingRange;
  options: SpreadOptions;
}

// In a worker the global postMessage answers the page (one argument, as the DOM typing's overload).
addEventListener('message', (e: MessageEvent<SpreadJob>) => {
  const { request, range, options } = e.data;
  const t0 = performance.now();
  try {
    const result = runSpread(request, range, options, (done, total) => postMessage({ type: 'progress', done, total }));
    postMessage({ type: 'done', result, elapsedMs: performance.now() - t0 });
  } catch (err) {
    const issues = err instanceof EngineInputError ? err.issues : [];
    postMessage({ type: 'error', message: issues[0]?.message ?? (err instanceof Error ? err.message : String(err)), issues });
  }
});
