/**
 * The Tune screen's use of the engine, in the browser: the power stage is
 * prepared once per stage change, the loop is re-analysed on every
 * compensator change (the drag path), and the snapped parts are checked on
 * the same prepared plant. The server runs analyze() again on save.
 */
import { analyzeLoop, marginsForCompensator, partValues, preparePlant, snapCompensator, type LoopResult, type PreparedPlant } from '@/lib/engine/analyze';
import { dividerRb } from '@/lib/engine/compensator';
import { snapToSeries } from '@/lib/engine/eseries';
import {
  EngineInputError,
  type AnalyzeRequest,
  type CompensatorInput,
  type FieldIssue,
  type Margins,
  type PartsOptions,
  type PartValues,
} from '@/lib/engine/types';

export const DEFAULT_PARTS: PartsOptions = { resistorSeries: 'E96', capacitorSeries: 'E12' };

export type Outcome<T> = { ok: true; value: T } | { ok: false; issues: FieldIssue[] };

function attempt<T>(fn: () => T): Outcome<T> {
  try {
    return { ok: true, value: fn() };
  } catch (err) {
    if (err instanceof EngineInputError) return { ok: false, issues: err.issues };
    return { ok: false, issues: [{ path: '(engine)', message: err instanceof Error ? err.message : String(err) }] };
  }
}

export const prepareStage = (input: AnalyzeRequest): Outcome<PreparedPlant> => attempt(() => preparePlant(input));

export const analyzeCompensator = (prepared: PreparedPlant, comp: CompensatorInput): Outcome<LoopResult> =>
  attempt(() => analyzeLoop(prepared, comp));

export interface PartsView {
  options: PartsOptions;
  ideal: PartValues;
  snapped: PartValues;
  snappedMargins: Margins | null;
}

/** Ideal and snapped parts with the margins the snapped parts give. */
export function analyzeParts(prepared: PreparedPlant, comp: CompensatorInput, parts: PartsOptions | undefined): PartsView {
  const options = { ...DEFAULT_PARTS, ...parts };
  const snappedComp = snapCompensator(comp, options);
  const rb = dividerRb(comp.r1, prepared.vref, prepared.converter.vout);
  const snappedMargins = attempt(() => marginsForCompensator(prepared, snappedComp));
  return {
    options,
    ideal: partValues(comp, rb),
    snapped: partValues(snappedComp, snapToSeries(rb, options.resistorSeries)),
    snappedMargins: snappedMargins.ok ? snappedMargins.value : null,
  };
}
