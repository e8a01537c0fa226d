/**
 * Corner sweep: the design analysed at every combination of its operating range's extremes
 * (line, load, L, C, ESR; compensator parts at nominal). Each corner is a full analyze() of
 * the stage with that corner's values, so the model that holds there (conduction mode,
 * control mode) applies by construction, and a corner's margins are exactly those of a
 * single analysis with the same values.
 */
import { analyze } from './analyze';
import { DEFAULT_TARGETS, describeCorner, enumerateCorners, rangeIssues, stageAtCorner, type CornerValues, type MarginTargets, type OperatingRange } from './range';
import { validateRequest } from './validate';
import { EngineInputError, type AnalyzeRequest, type BodeTrace, type Check, type FieldIssue } from './types';

export interface CornerMargins {
  crossoverHz: number | null;
  phaseMarginDeg: number | null;
  gainMarginDb: number | null;
}

export interface CornerResult extends CornerValues {
  conduction: 'CCM' | 'DCM';
  duty: number;
  margins: CornerMargins;
  /** The corner in words ("low line, full load, L −20 %, …"). */
  label: string;
  /** The risk-level checks the analysis raised at this corner (e.g. "subharmonic"), other than the margins' own. */
  risks: Pick<Check, 'id' | 'message'>[];
  /** Loop gain on the nominal sweep grid, when asked for (the Tune band). */
  loop?: BodeTrace;
}

export interface WorstValue {
  /** null for the phase margin: that corner has no crossover at all. */
  value: number | null;
  /** Index into corners; null when no corner has the quantity (no −180° crossing anywhere). */
  corner: number | null;
}

export interface CornersResult {
  corners: CornerResult[];
  worst: {
    phaseMarginDeg: WorstValue;
    gainMarginDb: WorstValue;
    crossoverHz: { min: number | null; max: number | null };
  };
}

export { DEFAULT_TARGETS, type MarginTargets } from './range';

/** Checks on the margins themselves: the worst-case margin checks speak for them across the corners. */
const MARGIN_CHECKS = new Set(['phase-margin-low', 'gain-margin-low', 'no-crossover']);

/** Paths of a stage problem at a corner, moved to the range field that made the corner. */
const cornerPath = (path: string, k: CornerValues, range: OperatingRange): string => {
  const side = (v: number, i: { min: number; max: number }) => (v === i.min ? 'min' : 'max');
  if (path === 'converter.iout') return `range.iout.${side(k.iout, range.iout)}`;
  if (path === 'converter.rc') return `range.rc.${side(k.rc, range.rc)}`;
  if (path === 'converter.l') return 'range.l.tol';
  if (path === 'converter.c') return 'range.c.tol';
  // Duty limits and the step-up/step-down rule are reported on vout; the line made them.
  if (path === 'converter.vin' || path === 'converter.vout') return `range.vin.${side(k.vin, range.vin)}`;
  return path;
};

/**
 * Analyse every corner. Worst phase margin: the lowest, or a corner without crossover (value
 * null) if there is one; worst gain margin: the lowest found (a corner whose phase never
 * reaches −180° has no gain margin to lose).
 * @throws EngineInputError for an impossible design, range or corner (paths under `range.`).
 */
export const analyzeCorners = (request: AnalyzeRequest, range: OperatingRange, options: { loop?: boolean } = {}): CornersResult => {
  validateRequest(request);
  const issues = rangeIssues(range);
  if (issues.length > 0) throw new EngineInputError(issues);
  const corners: CornerResult[] = [];
  for (const k of enumerateCorners(request.converter, range)) {
    const label = describeCorner(request.converter, range, k);
    let r;
    try {
      r = analyze({ ...request, converter: stageAtCorner(request.converter, k) });
    } catch (err) {
      if (!(err instanceof EngineInputError)) throw err;
      const moved: FieldIssue[] = err.issues.map((i) => ({ path: cornerPath(i.path, k, range), message: `at the corner ${label}: ${i.message}` }));
      throw new EngineInputError(moved);
    }
    const { crossoverHz, phaseMarginDeg, gainMarginDb } = r.margins;
    corners.push({
      ...k,
      conduction: r.operatingPoint.conduction,
      duty: r.operatingPoint.duty,
      margins: { crossoverHz, phaseMarginDeg, gainMarginDb },
      label,
      risks: r.checks.filter((c) => c.level === 'risk' && !MARGIN_CHECKS.has(c.id)).map(({ id, message }) => ({ id, message })),
      ...(options.loop ? { loop: r.bode.loop } : {}),
    });
  }
  return { corners, worst: worstOf(corners) };
};

const worstOf = (corners: CornerResult[]): CornersResult['worst'] => {
  let pm: WorstValue = { value: null, corner: null };
  let gm: WorstValue = { value: null, corner: null };
  let fMin: number | null = null;
  let fMax: number | null = null;
  let noCrossover: number | null = null;
  corners.forEach((k, i) => {
    const m = k.margins;
    if (m.phaseMarginDeg === null) noCrossover ??= i;
    else if (pm.value === null || m.phaseMarginDeg < pm.value) pm = { value: m.phaseMarginDeg, corner: i };
    if (m.gainMarginDb !== null && (gm.value === null || m.gainMarginDb < gm.value)) gm = { value: m.gainMarginDb, corner: i };
    if (m.crossoverHz !== null) {
      if (fMin === null || m.crossoverHz < fMin) fMin = m.crossoverHz;
      if (fMax === null || m.crossoverHz > fMax) fMax = m.crossoverHz;
    }
  });
  if (noCrossover !== null) pm = { value: null, corner: noCrossover };
  return { phaseMarginDeg: pm, gainMarginDb: gm, crossoverHz: { min: fMin, max: fMax } };
};

const fmt = (v: number, digits: number) => v.toFixed(digits).replace('-', '−');

/**
 * The worst-case versions of the loop checks: the corner where the phase or gain margin is
 * lowest, against the targets; corners in DCM are named (the plant changes order there).
 */
export const worstCaseChecks = (result: CornersResult, targets: MarginTargets = DEFAULT_TARGETS): Check[] => {
  const out: Check[] = [];
  const { corners, worst } = result;
  if (corners.length <= 1) return out;
  const pm = worst.phaseMarginDeg;
  if (pm.corner !== null) {
    const where = corners[pm.corner].label;
    if (pm.value === null) {
      out.push({ id: 'worst-no-crossover', level: 'risk', message: `At ${where} the loop gain never falls through 0 dB: there is no crossover, so the loop does not regulate there as designed.` });
    } else {
      const level = pm.value < 30 ? 'risk' : pm.value < targets.phaseMarginDeg ? 'caution' : 'note';
      const verdict = level === 'note' ? `meets the ${targets.phaseMarginDeg}° target at every corner` : `below the ${targets.phaseMarginDeg}° target`;
      out.push({ id: 'worst-phase-margin', level, message: `Worst phase margin: ${fmt(pm.value, 1)}° at ${where} (${verdict}).` });
    }
  }
  const gm = worst.gainMarginDb;
  if (gm.corner !== null && gm.value !== null) {
    const where = corners[gm.corner].label;
    const level = gm.value < 6 ? 'risk' : gm.value < targets.gainMarginDb ? 'caution' : 'note';
    const verdict = level === 'note' ? `meets the ${targets.gainMarginDb} dB target at every corner` : `below the ${targets.gainMarginDb} dB target`;
    out.push({ id: 'worst-gain-margin', level, message: `Worst gain margin: ${fmt(gm.value, 1)} dB at ${where} (${verdict}).` });
  }
  // A risk at a corner (a current loop that oscillates at fsw/2, a duty limit, …) makes its
  // margins meaningless there, however good they read.
  const risky = new Map<string, { first: CornerResult; message: string; count: number }>();
  for (const k of corners)
    for (const c of k.risks) {
      const seen = risky.get(c.id);
      if (seen) seen.count++;
      else risky.set(c.id, { first: k, message: c.message, count: 1 });
    }
  for (const [id, { first, message, count }] of risky) {
    const others = count > 1 ? ` (and ${count - 1} more of the ${corners.length} corners)` : '';
    out.push({ id: `worst-${id}`, level: 'risk', message: `At ${first.label}${others}: ${message}` });
  }
  const dcm = corners.filter((k) => k.conduction === 'DCM');
  if (dcm.length > 0) {
    out.push({
      id: 'corners-in-dcm',
      level: 'note',
      message: `${dcm.length} of ${corners.length} corners run in discontinuous conduction (${dcm[0].label}${dcm.length > 1 ? ', …' : ''}); their margins come from the model the engine applies there.`,
    });
  }
  return out;
};
