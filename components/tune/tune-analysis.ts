/**
 * The Tune screen's use of the engine, in the browser: the power stage is
 * prepared once per stage change, the loop is re-analysed on every
 * compensator change (the drag path), and the snapped parts are checked on
 * the same prepared plant. The server runs analyze() again on save.
 */
import { analyzeLoop, analyzeParts, preparePlant, type LoopResult, type PreparedPlant, type StageRequest } from '@/lib/engine/analyze';
import { EngineInputError, type CompensatorInput, type FieldIssue, type PartsOptions, type PartsResult } from '@/lib/engine/types';

export type Outcome<T> = { ok: true; value: T } | { ok: false; issues: FieldIssue[] };

function attempt<T>(fn: () => T): Outcome<T> {
  try {
    return { ok: true, value: fn() };
  } catch (err) {
    if (err instanceof EngineInputError) return { ok: false, issues: err.issues };
    return { ok: false, issues: [{ path: '(engine)', message: err instanceof Error ? err.message : String(err) }] };
  }
}

export const prepareStage = (input: StageRequest): Outcome<PreparedPlant> => attempt(() => preparePlant(input));

export const analyzeCompensator = (prepared: PreparedPlant, comp: CompensatorInput): Outcome<LoopResult> =>
  attempt(() => analyzeLoop(prepared, comp));

/** Ideal and snapped parts with the margins of the snapped parts; null when they cannot be analysed. */
export const analyzeCompensatorParts = (prepared: PreparedPlant, comp: CompensatorInput, options: Partial<PartsOptions> | undefined): PartsResult | null => {
  const r = attempt(() => analyzeParts(prepared, comp, options));
  return r.ok ? r.value : null;
};
