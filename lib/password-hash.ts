/**
 * Password hashing off the event loop: bcrypt (bcryptjs, cost 10) runs in a
 * small pool of worker threads, so a flood of sign-ins costs CPU on another
 * core but does not stall the requests of people already signed in. The pool
 * is PHASEWRIGHT_HASH_WORKERS threads (default 1: the machine's other core
 * stays with the web server); at most MAX_QUEUE jobs wait, beyond that the
 * caller is told the server is busy (HashBusyError → 429).
 */
import { Worker } from 'node:worker_threads';

const WORKER_SOURCE = `
const { parentPort } = require('node:worker_threads');
const { createRequire } = require('node:module');
const bcrypt = createRequire(process.cwd() + '/package.json')('bcryptjs');
parentPort.on('message', (m) => {
  try {
    const result = m.op === 'compare' ? bcrypt.compareSync(m.a, m.b) : bcrypt.hashSync(m.a, m.rounds);
    parentPort.postMessage({ id: m.id, result });
  } catch (e) {
    parentPort.postMessage({ id: m.id, error: String((e && e.message) || e) });
  }
});
`;

/**
 * A bcrypt hash of a password nobody has, compared against when an e-mail has
 * no account so an unknown address costs the same time as a wrong password.
 */
export const DUMMY_HASH = '$2b$10$qySLeSe7NZZW7dO9WdHO4eWY8wXJ6hc3laumqclpvm.9qILFAV7x6';
export const BCRYPT_ROUNDS = 10;
const MAX_QUEUE = 256;

export class HashBusyError extends Error {
  constructor() {
    super('Too many sign-ins at once; try again in a few seconds');
    this.name = 'HashBusyError';
  }
}

type Job = { id: number; op: 'compare' | 'hash'; a: string; b?: string; rounds?: number };
type Pending = { resolve: (v: boolean | string) => void; reject: (e: Error) => void };

interface Slot {
  worker: Worker;
  busy: Pending & { id: number } | null;
}

const pool: Slot[] = [];
const queue: { job: Job; pending: Pending }[] = [];
let nextId = 1;

function poolSize() {
  const n = Number(process.env.PHASEWRIGHT_HASH_WORKERS ?? 1);
  return Number.isInteger(n) && n >= 1 && n <= 8 ? n : 1;
}

function startSlot(): Slot {
  const slot: Slot = { worker: new Worker(WORKER_SOURCE, { eval: true }), busy: null };
  slot.worker.unref();
  slot.worker.on('message', (m: { id: number; result?: boolean | string; error?: string }) => {
    const p = slot.busy;
    slot.busy = null;
    if (p && p.id === m.id) {
      if (m.error) p.reject(new Error(m.error));
      else p.resolve(m.result as boolean | string);
    }
    pump();
  });
  slot.worker.on('error', (err) => {
    slot.busy?.reject(err);
    slot.busy = null;
    pool.splice(pool.indexOf(slot), 1);
    pump();
  });
  return slot;
}

function pump() {
  while (pool.length < poolSize()) pool.push(startSlot());
  for (const slot of pool) {
    if (slot.busy || queue.length === 0) continue;
    const { job, pending } = queue.shift()!;
    slot.busy = { ...pending, id: job.id };
    slot.worker.postMessage(job);
  }
}

function run<T extends boolean | string>(job: Omit<Job, 'id'>): Promise<T> {
  if (queue.length >= MAX_QUEUE) return Promise.reject(new HashBusyError());
  return new Promise<T>((resolve, reject) => {
    queue.push({ job: { ...job, id: nextId++ }, pending: { resolve: resolve as (v: boolean | string) => void, reject } });
    pump();
  });
}

/** Whether `password` matches `hash`; an absent hash is compared against DUMMY_HASH (same cost, always false). */
export async function comparePassword(password: string, hash: string | null | undefined): Promise<boolean> {
  const ok = await run<boolean>({ op: 'compare', a: password, b: hash ?? DUMMY_HASH });
  return Boolean(hash) && ok;
}

export function hashPasswordAsync(password: string): Promise<string> {
  return run<string>({ op: 'hash', a: password, rounds: BCRYPT_ROUNDS });
}
