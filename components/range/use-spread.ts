'use client';

import { useCallback, useEffect, useRef, useState } from 'react';
import type { OperatingRange } from '@/lib/engine/range';
import type { SpreadOptions, SpreadResult } from '@/lib/engine/spread';
import type { AnalyzeRequest } from '@/lib/engine/types';

export type SpreadState =
  | { status: 'idle' }
  | { status: 'running'; done: number; total: number; startedAt: number }
  | { status: 'done'; result: SpreadResult; elapsedMs: number }
  | { status: 'cancelled'; done: number; total: number }
  | { status: 'error'; message: string };

type WorkerMessage =
  | { type: 'progress'; done: number; total: number }
  | { type: 'done'; result: SpreadResult; elapsedMs: number }
  | { type: 'error'; message: string };

/** The tolerance spread in a Web Worker: progress as it runs, cancel by terminating the worker. */
export function useSpread() {
  const [state, setState] = useState<SpreadState>({ status: 'idle' });
  const worker = useRef<Worker | null>(null);

  const stop = () => {
    worker.current?.terminate();
    worker.current = null;
  };

  const run = useCallback((request: AnalyzeRequest, range: OperatingRange, options: SpreadOptions) => {
    stop();
    const w = new Worker(new URL('./spread.worker.ts', import.meta.url), { type: 'module' });
    worker.current = w;
    setState({ status: 'running', done: 0, total: options.samples, startedAt: performance.now() });
    w.onmessage = (e: MessageEvent<WorkerMessage>) => {
      if (worker.current !== w) return;
      const m = e.data;
      if (m.type === 'progress') setState((s) => (s.status === 'running' ? { ...s, done: m.done, total: m.total } : s));
      else {
        stop();
        setState(m.type === 'done' ? { status: 'done', result: m.result, elapsedMs: m.elapsedMs } : { status: 'error', message: m.message });
      }
    };
    w.onerror = (e) => {
      stop();
      setState({ status: 'error', message: e.message || 'The spread stopped unexpectedly' });
    };
    // structuredClone drops nothing the engine needs; the worker gets plain data.
    w.postMessage({ request, range, options });
  }, []);

  const cancel = useCallback(() => {
    stop();
    setState((s) => (s.status === 'running' ? { status: 'cancelled', done: s.done, total: s.total } : s));
  }, []);

  useEffect(() => stop, []);
  return { state, run, cancel };
}
