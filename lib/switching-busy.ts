/** The switching simulation's queue is full (lib/switching-pool.ts); lib/api.ts answers 503 with Retry-After. */
export class SwitchingBusyError extends Error {
  readonly retryAfterSeconds: number;
  constructor(retryAfterSeconds: number) {
    super('The switching simulation is busy with other runs; try again in a few seconds');
    this.name = 'SwitchingBusyError';
    this.retryAfterSeconds = retryAfterSeconds;
  }
}
