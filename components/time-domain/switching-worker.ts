/**
 * Web Worker: the switching check runs here, off the page's thread, and reports progress.
 * Message in: { kind: 'injection', request, frequencies? } | { kind: 'step', request, step }.
 * Messages out: { type: 'progress', fraction, message } … then { type: 'done', result } or
 * { type: 'error', message, issues }.
 */
import { EngineInputError } from '@/lib/engine/types';
import { runSwitchingJob, type SwitchingJob } from './run-switching-job';

self.addEventListener('message', (event: MessageEvent<SwitchingJob>) => {
  const job = event.data;
  const progress = (fraction: number, message: string) => self.postMessage({ type: 'progress', fraction, message });
  try {
    self.postMessage({ type: 'done', result: runSwitchingJob(job, progress) });
  } catch (err) {
    const issues = err instanceof EngineInputError ? err.issues : [];
    self.postMessage({ type: 'error', message: err instanceof Error ? err.message : String(err), issues });
  }
});
