import { useMutation } from '@tanstack/react-query';
import { useCallback, useEffect, useRef, useState } from 'react';
import type { ModelCheckResult, SwitchingStepResult } from '@/lib/engine/switching-check';
import type { AnalyzeRequest, FieldIssue, StepDefinition } from '@/lib/engine/types';

export type SwitchingJob =
  | { kind: 'injection'; request: AnalyzeRequest; frequencies?: number[] }
  | { kind: 'step'; request: AnalyzeRequest; step: StepDefinition };

export type SwitchingOutcome = ({ kind: 'injection' } & ModelCheckResult) | ({ kind: 'step' } & SwitchingStepResult);

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
  const stop = useCallback(() => {
    worker.current?.terminate();
    worker.current = null;
  }, []);
  useEffect(() => stop, [stop]);
  const mutation = useMutation({
    mutationFn: (job: SwitchingJob) =>
      new Promise<SwitchingOutcome>((resolve, reject) => {
        stop();
        const w = new Worker(new URL('./switching-worker.ts', import.meta.url), { type: 'module' });
        worker.current = w;
        setProgress({ fraction: 0, message: 'starting' });
        w.onmessage = (e: MessageEvent<WorkerMessage>) => {
          const m = e.data;
          if (m.type === 'progress') setProgress({ fraction: m.fraction, message: m.message });
          else {
            stop();
            setProgress(null);
            if (m.type === 'done') resolve(m.result);
            else reject(new SwitchingJobError(m.message, m.issues));
          }
        };
        w.onerror = (e) => {
          stop();
          setProgress(null);
          reject(new SwitchingJobError(e.message || 'the simulation stopped', []));
        };
      }),
  });
  const cancel = () => {
    stop();
    setProgress(null);
    mutation.reset();
  };
  return { ...mutation, progress, cancel };
}
