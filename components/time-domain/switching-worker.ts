/**
 * Web Worker: the switching check runs here, off the page's thread, and reports progress.
 * Message in: { kind: 'injection', request, frequencies? } | { kind: 'step', request, step }.
 * Messages out: { type: 'progress', fraction, message } … then { type: 'done', result } or
 * { type: 'error', message, issues }.
 */
import { modelCheck, switchingStep } from '@/lib/engine/switching-check';
import { EngineInputError } from '@/lib/engine/types';
import type { SwitchingJob } from './switching-job';

self.addEventListener('message', (event: MessageEvent<SwitchingJob>) => {
  const job = event.data;
  const progress = (fraction: number, message: string) => self.postMessage({ type: 'progress', fraction, message });
  try {
    const result =
      job.kind === 'injection'
        ? { kind: 'injection' as const, ...modelCheck(job.request, job.frequencies, progress) }
        : { kind: 'step' as const, ...switchingStep(job.request, job.step, progress) };
    self.postMessage({ type: 'done', result });
  } catch (err) {
    const issues = err instanceof EngineInputError ? err.issues : [];
    self.postMessage({ type: 'error', message: err instanceof Error ? err.message : String(err), issues });
  }
});
