/**
 * Worker-thread entry of the switching simulation (lib/switching-pool.ts starts it): one job
 * at a time, answered with the response body, the engine's field issues (→ 422) or an error.
 */
import { parentPort } from 'node:worker_threads';
import { EngineInputError } from '@/lib/engine/types';
import { switchingBody } from './switching-body';
import type { SwitchingJobMessage } from './switching-pool';

parentPort?.on('message', (m: SwitchingJobMessage) => {
  try {
    parentPort!.postMessage({ id: m.id, body: switchingBody(m.request, m.work) });
  } catch (err) {
    if (err instanceof EngineInputError) parentPort!.postMessage({ id: m.id, issues: err.issues });
    else parentPort!.postMessage({ id: m.id, error: err instanceof Error ? err.message : String(err) });
  }
});
