import { useMutation } from '@tanstack/react-query';
import { useCallback, useEffect, useRef, useState } from 'react';
import { EngineInputError, type FieldIssue } from '@/lib/engine/types';
import { runSwitchingJob, type SwitchingJob, type SwitchingOutcome } from './run-switching-job';

export type { SwitchingJob, SwitchingOutcome };

type WorkerMessage =
  | { type: 'progress'; fraction: number; message: string }
  | { type: 'done'; result: SwitchingOutcome }
  | { type: 'error'; message: string; issues: FieldIssue[] };

export class SwitchingJobError extends Error {
  constructor(
    message: string,
    readonly issues: FieldIssue[],
  ) {
    super(message);
  }
}

/**
 * Run the switching check in a Web Worker (one per run, ended when done or cancelled), as a
 * react-query mutation with progress. `cancel` ends the worker at once.
 */
export function useSwitchingJob() {
  const worker = useRef<Worker | null>(null);
  const [progress, setProgress] = useState<{ fraction: number; message: string } | null>(null);
  /** Where the last run computed: in the Web Worker, or on the page when no worker answered. */
  const [via, setVia] = useState<'worker' | 'page' | null>(null);
  const stop = useCallback(() => {
    worker.current?.terminate();
    worker.current = null;
  }, []);
  useEffect(() => stop, [stop]);
  const mutation = useMutation({
    mutationFn: (job: SwitchingJob) =>
      new Promise<SwitchingOutcome>((resolve, reject) => {
        stop();
        setProgress({ fraction: 0, message: 'starting' });
        setVia(null);
        let heard = false;
        let settled = false;
        const finish = (f: () => void) => {
          if (settled) return;
          settled = true;
          window.clearTimeout(silence);
          stop();
          setProgress(null);
          f();
        };
        // Where no worker can start (a blocked script, an old browser), the job runs on the page:
        // the result is the same, only without progress while it runs.
        const runHere = () =>
          window.setTimeout(() => {
            try {
              const result = runSwitchingJob(job);
              finish(() => resolve(result));
            } catch (err) {
              finish(() => reject(new SwitchingJobError(err instanceof Error ? err.message : String(err), err instanceof EngineInputError ? err.issues : [])));
            }
          }, 30);
        const fallBack = () => {
          if (settled) return;
          stop();
          setVia('page');
          setProgress({ fraction: 0, message: 'running on this page' });
          runHere();
        };
        const silence = window.setTimeout(() => (heard ? undefined : fallBack()), 8000);
        let w: Worker;
        try {
          w = new Worker(new URL('./switching-worker.ts', import.meta.url));
        } catch {
          fallBack();
          return;
        }
        worker.current = w;
        w.onmessage = (e: MessageEvent<WorkerMessage>) => {
          if (!heard) setVia('worker');
          heard = true;
          const m = e.data;
          if (m.type === 'progress') setProgress({ fraction: m.fraction, message: m.message });
          else if (m.type === 'done') finish(() => resolve(m.result));
          else finish(() => reject(new SwitchingJobError(m.message, m.issues)));
        };
        w.onerror = () => (heard ? finish(() => reject(new SwitchingJobError('the simulation stopped', []))) : fallBack());
        w.postMessage(job);
      }),
  });
  const cancel = () => {
    stop();
    setProgress(null);
    mutation.reset();
  };
  return { ...mutation, progress, via, cancel };
}
