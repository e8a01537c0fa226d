/**
 * Runs the tolerance spread off the page's thread. Messages: in { request, range, options };
 * out { type: 'progress', done, total } at most every 100 ms, then { type: 'done', result,
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
    // At most one progress message per 100 ms: each one re-renders the page, and a flood of
    // them would queue a click on Cancel behind the renders.
    let last = -Infinity;
    const progress = (done: number, total: number) => {
      const now = performance.now();
      if (now - last < 100 && done < total) return;
      last = now;
      postMessage({ type: 'progress', done, total });
    };
    const result = runSpread(request, range, options, progress);
    postMessage({ type: 'done', result, elapsedMs: performance.now() - t0 });
  } catch (err) {
    const issues = err instanceof EngineInputError ? err.issues : [];
    postMessage({ type: 'error', message: issues[0]?.message ?? (err instanceof Error ? err.message : String(err)), issues });
  }
});
