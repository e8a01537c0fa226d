/**
 * The switching simulation off the request thread. A run costs 1–4 s of CPU; computed in the
 * route it would hold every other request of the server for that long. Here it runs in one
 * worker thread (the machine's other core stays with the web server), one job at a time, with
 * at most PHASEWRIGHT_SWITCHING_QUEUE (default 4) jobs waiting; beyond that the caller is told
 * the server is busy (SwitchingBusyError → 503 with Retry-After).
 *
 * Should the worker not start at all (a deployment that lost its bundle), the job runs in the
 * request as before, logged once, and the answer says so in `x-phasewright-compute: inline`
 * (`worker` otherwise).
 */
import { Worker } from 'node:worker_threads';
import type { AnalyzeRequest, FieldIssue } from '@/lib/engine/types';
import { EngineInputError } from '@/lib/engine/types';
import type { SwitchingWork } from '@/lib/validation/time-domain';
import { switchingBody, type SwitchingBody } from './switching-body';
import { SwitchingBusyError } from './switching-busy';

export type SwitchingJobMessage = { id: number; request: AnalyzeRequest; work: SwitchingWork };
type Reply = { id: number; body?: SwitchingBody; issues?: FieldIssue[]; error?: string };

export type SwitchingOutcome = { body: SwitchingBody; via: 'worker' | 'inline' };

type Pending = { job: SwitchingJobMessage; resolve: (o: SwitchingOutcome) => void; reject: (e: Error) => void };

const maxWaiting = () => {
  const n = Number(process.env.PHASEWRIGHT_SWITCHING_QUEUE ?? 4);
  return Number.isInteger(n) && n >= 0 && n <= 64 ? n : 4;
};

let worker: Worker | null = null;
/** Set when a worker failed before it ever came online: jobs then run inline. */
let cannotStart = false;
let running: Pending | null = null;
const waiting: Pending[] = [];
let nextId = 1;

const runInline = (p: Pending) => {
  try {
    p.resolve({ body: switchingBody(p.job.request, p.job.work), via: 'inline' });
  } catch (err) {
    p.reject(err instanceof Error ? err : new Error(String(err)));
  }
};

function startWorker(): Worker {
  const w = new Worker(new URL('./switching-thread.ts', import.meta.url));
  let online = false;
  w.on('online', () => (online = true));
  w.on('message', (m: Reply) => {
    const p = running;
    if (!p || p.job.id !== m.id) return;
    running = null;
    if (m.body) p.resolve({ body: m.body, via: 'worker' });
    else if (m.issues) p.reject(new EngineInputError(m.issues));
    else p.reject(new Error(m.error ?? 'the switching simulation failed'));
    pump();
  });
  const lost = (err: Error) => {
    if (worker !== w) return;
    worker = null;
    const p = running;
    running = null;
    if (!online) {
      cannotStart = true;
      console.error('[switching] the worker thread did not start; running simulations in the request instead:', err);
      if (p) runInline(p);
    } else p?.reject(err);
    pump();
  };
  w.on('error', lost);
  w.on('exit', (code) => lost(new Error(`the switching worker stopped (exit code ${code})`)));
  return w;
}

function pump() {
  if (running || waiting.length === 0) return;
  const p = waiting.shift()!;
  if (cannotStart) {
    runInline(p);
    pump();
    return;
  }
  try {
    worker ??= startWorker();
  } catch (err) {
    cannotStart = true;
    console.error('[switching] the worker thread did not start; running simulations in the request instead:', err);
    runInline(p);
    pump();
    return;
  }
  running = p;
  worker.postMessage(p.job);
}

/**
 * Run one switching simulation (queued behind the one running).
 * @throws SwitchingBusyError when the queue is full; EngineInputError for the engine's 422s.
 */
export function runSwitching(request: AnalyzeRequest, work: SwitchingWork): Promise<SwitchingOutcome> {
  const queued = waiting.length + (running ? 1 : 0);
  if (running && waiting.length >= maxWaiting()) return Promise.reject(new SwitchingBusyError(2 * queued));
  return new Promise<SwitchingOutcome>((resolve, reject) => {
    waiting.push({ job: { id: nextId++, request, work }, resolve, reject });
    pump();
  });
}
