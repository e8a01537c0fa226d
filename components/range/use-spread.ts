'use client';

import { useCallback, useEffect, useRef, useState, useSyncExternalStore } from 'react';
import type { OperatingRange } from '@/lib/engine/range';
import type { SpreadOptions, SpreadResult } from '@/lib/engine/spread';
import type { AnalyzeRequest } from '@/lib/engine/types';

/**
 * Samples done so far, as a small store of its own: progress arrives every 100 ms, and only
 * the progress bar should re-render for it, not the Tune screen that holds the spread's state
 * (a whole-screen render per message kept the page too busy to take a click on Cancel).
 */
export interface SpreadProgress {
  get: () => number;
  subscribe: (onChange: () => void) => () => void;
}

const createProgress = () => {
  let done = 0;
  const listeners = new Set<() => void>();
  const store: SpreadProgress & { set: (n: number) => void } = {
    get: () => done,
    subscribe: (onChange) => {
      listeners.add(onChange);
      return () => listeners.delete(onChange);
    },
    set: (n) => {
      done = n;
      for (const l of listeners) l();
    },
  };
  return store;
};

/** The samples done of a running spread, re-rendering only the component that reads it. */
export function useSpreadProgress(progress: SpreadProgress | null): number {
  const subscribe = useCallback((cb: () => void) => (progress ? progress.subscribe(cb) : () => {}), [progress]);
  return useSyncExternalStore(subscribe, () => progress?.get() ?? 0, () => 0);
}

export type SpreadState =
  | { status: 'idle' }
  | { status: 'running'; total: number; startedAt: number; progress: SpreadProgress }
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
  const progress = useRef<ReturnType<typeof createProgress> | null>(null);

  const stop = () => {
    worker.current?.terminate();
    worker.current = null;
  };

  const run = useCallback((request: AnalyzeRequest, range: OperatingRange, options: SpreadOptions) => {
    stop();
    const w = new Worker(new URL('./spread.worker.ts', import.meta.url), { type: 'module' });
    worker.current = w;
    const p = createProgress();
    progress.current = p;
    setState({ status: 'running', total: options.samples, startedAt: performance.now(), progress: p });
    w.onmessage = (e: MessageEvent<WorkerMessage>) => {
      if (worker.current !== w) return;
      const m = e.data;
      if (m.type === 'progress') p.set(m.done);
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
    setState((s) => (s.status === 'running' ? { status: 'cancelled', done: s.progress.get(), total: s.total } : s));
  }, []);

  useEffect(() => stop, []);
  return { state, run, cancel };
}
