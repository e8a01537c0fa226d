/**
 * The analysis: power stage → plant (control-to-output under the modulator: Gvd/Vramp in
 * voltage mode, Gvc in peak current mode, the DCM model at light load; control.ts) →
 * compensator Gc → loop T = Gc·plant → margins, standard parts (ideal and snapped) and checks.
 *
 * Two entry points share one code path:
 * - analyze(request): the full result of POST /api/analyze;
 * - preparePlant(request) once, then analyzeLoop(prepared, compensator) per change: the Tune
 *   screen's drag loop. The plant's sweep is reused, only the compensator is swept again.
 */
import { compensatorTransfer, dividerRb, gbwEnough, opAmpShapeError, shapeFromParts, summarizeCompensator } from './compensator';
import { amplifierChecks, loopChecks, modulatorChecks, partChecks, stageChecks } from './checks';
import { buildControlPlant } from './control';
import { snapToSeries } from './eseries';
import { marginsFromCrossings, marginsFromScan, type LoopPointEvaluator } from './margins';
import { esrZeroHint, type PlantModel } from './plant';
import {
  defaultSweep,
  loopPass,
  nearWatch,
  planEvaluator,
  planTransfer,
  productPlan,
  scanPlan,
  scanTransfer,
  sweepGrid,
  sweepPlan,
  type Grid,
  type NearWatch,
  type ScanCandidates,
  type TransferPlan,
} from './sweep';
import { multiplyTransfers, ratioBound, summarizeTransfer, type SectionedTransfer } from './transfer';
import { withLossDefaults } from './steady-state';
import { compensatorIssues, stageIssues, validateRequest } from './validate';
import {
  EngineInputError,
  type AnalyzeRequest,
  type AnalyzeResult,
  type BodeData,
  type BodeTrace,
  type Check,
  type CompensatorInput,
  type CompensatorSummary,
  type ConverterInput,
  type Margins,
  type ModulatorSummary,
  type OperatingPoint,
  type PartsOptions,
  type PartsResult,
  type PartValues,
  type SweepOptions,
  type TransferSummary,
} from './types';

/** Everything of a request except the compensator. */
export type StageRequest = Pick<AnalyzeRequest, 'converter' | 'modulator' | 'feedback' | 'sweep'>;

/** The power stage analysed once, reused for every compensator change. */
export interface PreparedPlant {
  converter: ConverterInput;
  vref: number;
  sweep: SweepOptions;
  /** The CCM averaged model of the stage (duty held). */
  model: PlantModel;
  operatingPoint: OperatingPoint;
  /** The modulator at the operating point (voltage: gain 1/Vramp; peak current: Ridley's quantities). */
  modulator: ModulatorSummary;
  /** DCM low-frequency pole, Hz; null in CCM. */
  dcmPoleHz: number | null;
  /** DC voltage at the modulator input (compensator output), V. */
  controlVoltage: number;
  /** Control-to-output under the modulator, sign-corrected: the loop's plant. */
  plantTransfer: SectionedTransfer;
  /** Line-to-output and output impedance with the modulator input held. */
  lineToOutputTransfer: SectionedTransfer;
  outputImpedanceTransfer: SectionedTransfer;
  plant: TransferSummary;
  lineToOutput: TransferSummary;
  outputImpedance: TransferSummary;
  grid: Grid;
  plantTrace: BodeTrace;
  /** The plant as the sweeps evaluate it (sweep.ts): loops are planned from it and the compensator's. */
  plantPlan: TransferPlan;
  stageChecks: Check[];
}

/** What the drag loop needs back after each compensator change. */
export interface LoopResult {
  compensator: CompensatorSummary;
  margins: Margins;
  phaseAtHalfFswDeg: number | null;
  bode: BodeData;
  /** Loop, stage and part-range checks (the full set analyze() reports). */
  checks: Check[];
}

const DEFAULT_PARTS: PartsOptions = { resistorSeries: 'E96', capacitorSeries: 'E12' };

/**
 * Validate and analyse the power stage: operating point, averaged model, Gvd/Vramp on the
 * sweep grid. @throws EngineInputError for physically impossible input.
 */
export const preparePlant = (req: StageRequest): PreparedPlant => {
  const issues = stageIssues(req);
  if (issues.length > 0) throw new EngineInputError(issues);
  return prepareValidPlant(req);
};

/** preparePlant for a stage already checked (analyze() validates the whole request once). */
const prepareValidPlant = (req: StageRequest): PreparedPlant => {
  const converter = withLossDefaults(req.converter);
  const control = buildControlPlant(converter, req.modulator);
  const plantTransfer = control.plantTransfer;
  const sweep = req.sweep ?? defaultSweep(converter.fsw);
  const grid = sweepGrid(sweep.fStart, sweep.fStop, sweep.points);
  const hint = esrZeroHint(converter);
  const op = control.operatingPoint;
  const plantPlan = planTransfer(plantTransfer);
  return {
    converter,
    vref: req.feedback.vref,
    sweep,
    model: control.model,
    operatingPoint: op,
    modulator: control.modulator,
    dcmPoleHz: control.dcmPoleHz,
    controlVoltage: control.controlVoltage,
    plantTransfer,
    lineToOutputTransfer: control.lineToOutput,
    outputImpedanceTransfer: control.outputImpedance,
    plant: summarizeTransfer(plantTransfer, hint),
    lineToOutput: summarizeTransfer(control.lineToOutput, hint),
    outputImpedance: summarizeTransfer(control.outputImpedance, hint),
    grid,
    plantTrace: sweepPlan(plantPlan, grid),
    plantPlan,
    stageChecks: [...stageChecks(op), ...modulatorChecks(op, control.modulator, control.dcmPoleHz)],
  };
};

/**
 * The loop T(j2πf) = Gc·Gvd/Vramp as an analytic function, magnitude in dB and phase in
 * degrees on the branch of the Bode plot: the phase at the sweep start is its principal value
 * (or the multiple of 360° nearest `startDeg`, to follow a given trace). For hover read-outs
 * and crossing refinement.
 */
export const evaluateLoopGain = (
  prepared: PreparedPlant,
  comp: SectionedTransfer | CompensatorInput,
  startDeg?: number,
): LoopPointEvaluator => {
  const gc = 'type' in comp ? loopCompensatorTransfer(prepared, comp) : comp;
  return planEvaluator(productPlan(prepared.plantPlan, planTransfer(gc)), prepared.grid.f[0], startDeg);
};

/**
 * Gc as the loop sees it. A finite op-amp's inverting input is loaded by the divider's Rb
 * (set by vref unless given), so Rb is filled in before the transfer is built.
 */
export const loopCompensatorTransfer = (prepared: PreparedPlant, comp: CompensatorInput): SectionedTransfer =>
  compensatorTransfer(comp, loopRb(prepared, comp));

/** The Rb the loop's compensator sees: a finite op-amp's is set by vref unless given. */
const loopRb = (prepared: PreparedPlant, comp: CompensatorInput): number | undefined =>
  comp.opamp && comp.amplifier !== 'transconductance' && comp.rb === undefined ? divider(prepared, comp) : comp.rb;

/**
 * Loop gain on the grid (plant sweep reused) and its analytic evaluator on the same branch.
 * One pass adds the plant's and compensator's traces and notes the crossing intervals and the
 * conditional-stability point (LoopPass), and with `near` the samples a nearby loop needs
 * looked at (NearWatch): no further pass over the samples.
 */
const sweepLoop = (prepared: PreparedPlant, comp: SectionedTransfer, near?: NearWatch) => {
  const compPlan = planTransfer(comp);
  const f = prepared.grid.f;
  const compTrace = sweepPlan(compPlan, prepared.grid);
  const pass = loopPass(prepared.plantTrace, compTrace, f, near);
  return {
    compTrace,
    loop: { f, magDb: pass.magDb, phaseDeg: pass.phaseDeg },
    crossings: pass.crossings,
    belowMinus180Hz: pass.belowMinus180Hz,
    evaluate: planEvaluator(productPlan(prepared.plantPlan, compPlan), f[0], pass.phaseDeg[0]),
  };
};

const checkCompensator = (comp: CompensatorInput) => {
  const issues = compensatorIssues(comp);
  if (issues.length > 0) throw new EngineInputError(issues);
};

/**
 * Loop margins only, no traces (snapped parts, corner sweeps): T = Gc·Gvd/Vramp scanned on
 * the grid for its crossings (section products, no arctangent or logarithm per point:
 * scanPlan); only the crossings are then refined on the analytic loop, as in analyzeLoop, so
 * the margins are those a full sweep would give.
 */
export const marginsForCompensator = (prepared: PreparedPlant, comp: CompensatorInput): Margins => {
  checkCompensator(comp);
  return marginsOnPlant(prepared, loopCompensatorTransfer(prepared, comp));
};

/**
 * The margins of a compensator's transfer `gc` on the plant: the loop planned from the plant's
 * plan. With `only`, the scan looks at those intervals alone (ScanCandidates, from the ideal
 * loop's pass for its snapped parts): the same margins, a fraction of the work.
 */
const marginsOnPlant = (prepared: PreparedPlant, gc: SectionedTransfer, only?: ScanCandidates): Margins => {
  const { scan, evaluate } = scanPlan(productPlan(prepared.plantPlan, planTransfer(gc)), prepared.grid, only);
  return marginsFromScan(prepared.grid.f, scan, evaluate);
};

/**
 * The margins of marginsForCompensator from the plant transfer alone (the tolerance spread's
 * hot path: no operating-point summaries, no plant trace). Assumes validated parts; a finite
 * op-amp's Rb is `rb`, comp.rb unless given (see loopRb).
 */
export const loopMargins = (plantTransfer: SectionedTransfer, grid: Grid, comp: CompensatorInput, rb: number | undefined = comp.rb): Margins => {
  const { scan, evaluate } = scanTransfer(multiplyTransfers(plantTransfer, compensatorTransfer(comp, rb)), grid);
  return marginsFromScan(grid.f, scan, evaluate);
};

/**
 * The plant of the loop (the mode's control-to-output, control.ts) and the sweep grid, and
 * nothing else: what loopMargins needs per sample of the spread. The same model preparePlant
 * builds. Assumes a validated stage.
 */
export const loopPlant = (req: StageRequest): { plantTransfer: SectionedTransfer; grid: Grid } => {
  const converter = withLossDefaults(req.converter);
  const sweep = req.sweep ?? defaultSweep(converter.fsw);
  return {
    plantTransfer: buildControlPlant(converter, req.modulator).plantTransfer,
    grid: sweepGrid(sweep.fStart, sweep.fStop, sweep.points),
  };
};

/** The plant transfer of a stage (validated) on a grid already made: one sample of the spread. */
export const loopPlantTransfer = (req: StageRequest): SectionedTransfer =>
  buildControlPlant(withLossDefaults(req.converter), req.modulator).plantTransfer;

/**
 * Fast path for the Tune screen: loop, margins, Bode traces and checks for a compensator on
 * an already prepared plant. @throws EngineInputError for impossible compensator parts.
 */
export const analyzeLoop = (prepared: PreparedPlant, comp: CompensatorInput): LoopResult => {
  checkCompensator(comp);
  return analyzeValidLoop(prepared, comp);
};

/**
 * analyzeLoop for a validated compensator; `gc` when the caller has built the loop's transfer
 * already, `near` to note what a nearby loop's scan needs (NearWatch).
 */
const analyzeValidLoop = (prepared: PreparedPlant, comp: CompensatorInput, gc?: SectionedTransfer, near?: NearWatch): LoopResult => {
  const rbLoop = loopRb(prepared, comp);
  const { compTrace, loop, crossings, belowMinus180Hz, evaluate } = sweepLoop(prepared, gc ?? compensatorTransfer(comp, rbLoop), near);
  const margins = marginsFromCrossings(loop, crossings, evaluate);
  const rb = divider(prepared, comp);
  const fsw = prepared.converter.fsw;
  let shapeError = null;
  let gbwEnoughHz = null;
  if (comp.opamp && comp.amplifier !== 'transconductance') {
    const placed = shapeFromParts(comp).polesHz.filter((f) => f < fsw / 2);
    const freqs = margins.crossoverHz !== null ? [margins.crossoverHz, ...placed] : placed;
    shapeError = opAmpShapeError(comp, freqs, rbLoop);
    if (shapeError.worstDb > 1 || shapeError.worstDeg > 5) gbwEnoughHz = gbwEnough(comp, freqs, rbLoop);
  }
  return {
    compensator: summarizeCompensator(comp),
    margins,
    phaseAtHalfFswDeg: evaluate(prepared.converter.fsw / 2).phaseDeg,
    bode: {
      f: prepared.grid.f as number[],
      loop: { magDb: loop.magDb, phaseDeg: loop.phaseDeg },
      plant: prepared.plantTrace,
      compensator: compTrace,
    },
    checks: [
      ...prepared.stageChecks,
      ...loopChecks({ margins, loop, fsw: prepared.converter.fsw, rhpZeroHz: prepared.plant.rhpZeroHz, belowMinus180Hz }),
      ...partChecks(comp, rb),
      ...amplifierChecks({ comp, shapeError, gbwEnoughHz, vref: prepared.vref, vout: prepared.converter.vout }),
    ],
  };
};

/** The divider's lower resistor: given with a transconductance amplifier, else set by vref. */
const divider = (prepared: PreparedPlant, comp: CompensatorInput): number =>
  comp.rb !== undefined && comp.rb > 0 ? comp.rb : dividerRb(comp.r1, prepared.vref, prepared.converter.vout);

/** Parts as the contract lists them: unused parts null, C2 0 when absent. */
export const partValues = (comp: CompensatorInput, rb: number | null): PartValues => ({
  r1: comp.r1,
  r2: comp.type === 'type1' ? null : (comp.r2 ?? null),
  r3: comp.type === 'type3' ? (comp.r3 ?? null) : null,
  c1: comp.c1,
  c2: comp.type === 'type1' ? null : (comp.c2 ?? 0),
  c3: comp.type === 'type3' ? (comp.c3 ?? null) : null,
  rb,
});

/**
 * Compensator with every part snapped to its series (C2 = 0 stays absent); a
 * transconductance stage's Rb is snapped too, the amplifier's own gm, ro and an op-amp
 * model are kept.
 */
export const snapCompensator = (comp: CompensatorInput, parts: PartsOptions): CompensatorInput => {
  const rs = parts.resistorSeries;
  const cs = parts.capacitorSeries;
  // Field by field rather than by object spread: this runs per analysis and per spread sample,
  // and a spread of objects of varying shape is several times slower in V8.
  const out: CompensatorInput = { ...comp };
  out.r1 = snapToSeries(comp.r1, rs);
  out.c1 = snapToSeries(comp.c1, cs);
  if (comp.r2 !== undefined) out.r2 = snapToSeries(comp.r2, rs);
  if (comp.r3 !== undefined) out.r3 = snapToSeries(comp.r3, rs);
  if (comp.c2 !== undefined && comp.c2 !== 0) out.c2 = snapToSeries(comp.c2, cs);
  if (comp.c3 !== undefined && comp.c3 !== 0) out.c3 = snapToSeries(comp.c3, cs);
  if (comp.amplifier === 'transconductance' && comp.rb !== undefined) out.rb = snapToSeries(comp.rb, rs);
  return out;
};

/**
 * The compensator that will be built: every part at its standard value in the request's series
 * (default E96 resistors, E12 capacitors), as analyze() reports it under `parts.snapped` and
 * its snappedMargins. The tolerance spread samples around these values.
 */
export const standardValueCompensator = (comp: CompensatorInput, options?: Partial<PartsOptions>): CompensatorInput =>
  snapCompensator(comp, { ...DEFAULT_PARTS, ...options });

const sameParts = (a: CompensatorInput, b: CompensatorInput) =>
  a.type === b.type && a.r1 === b.r1 && a.r2 === b.r2 && a.r3 === b.r3 && a.c1 === b.c1 && a.c2 === b.c2 && a.c3 === b.c3 && a.rb === b.rb;

/** Ideal and snapped part values of the result, with the snapped parts' margins. */
const partsResult = (
  prepared: PreparedPlant,
  comp: CompensatorInput,
  snappedComp: CompensatorInput,
  series: PartsOptions,
  snappedMargins: Margins,
): PartsResult => {
  const rb = divider(prepared, comp);
  return {
    resistorSeries: series.resistorSeries,
    capacitorSeries: series.capacitorSeries,
    ideal: partValues(comp, rb),
    snapped: partValues(snappedComp, snapToSeries(rb, series.resistorSeries)),
    snappedMargins,
  };
};

/**
 * Ideal and snapped parts with the margins the snapped parts give (defaults: E96 resistors,
 * E12 capacitors). Rb is the divider's lower resistor, snapped to the resistor series.
 */
export const analyzeParts = (prepared: PreparedPlant, comp: CompensatorInput, options?: Partial<PartsOptions>): PartsResult => {
  const series = { ...DEFAULT_PARTS, ...options };
  const snappedComp = snapCompensator(comp, series);
  // Snapping keeps every part positive, so the snapped compensator of a valid one is valid.
  return partsResult(prepared, comp, snappedComp, series, marginsOnPlant(prepared, loopCompensatorTransfer(prepared, snappedComp)));
};

/**
 * Full analysis of a design (POST /api/analyze).
 * @throws EngineInputError (→ 422) for physically impossible input, naming each field.
 */
export const analyze = (request: AnalyzeRequest): AnalyzeResult => {
  validateRequest(request);
  const prepared = prepareValidPlant(request);
  const comp = request.compensator;
  const gc = compensatorTransfer(comp, loopRb(prepared, comp));
  const series = { ...DEFAULT_PARTS, ...request.parts };
  const snappedComp = snapCompensator(comp, series);
  // Parts already standard give the same loop; otherwise the snapped loop lies within a bound
  // of the ideal one (ratioBound), and the ideal loop's pass notes where its scan must look.
  const same = sameParts(comp, snappedComp);
  const gcSnapped = same ? gc : compensatorTransfer(snappedComp, loopRb(prepared, snappedComp));
  const bound = same ? null : ratioBound(gc, gcSnapped);
  // Slack for the rounding of the two loops' arithmetic.
  const near = bound ? nearWatch(bound.db + 1e-9, bound.deg + 1e-9) : undefined;
  const loop = analyzeValidLoop(prepared, comp, gc, near);
  const snappedMargins = same ? loop.margins : marginsOnPlant(prepared, gcSnapped, near?.only);
  return {
    operatingPoint: prepared.operatingPoint,
    plant: prepared.plant,
    modulator: prepared.modulator,
    dcmPoleHz: prepared.dcmPoleHz,
    lineToOutput: prepared.lineToOutput,
    outputImpedance: prepared.outputImpedance,
    compensator: loop.compensator,
    margins: loop.margins,
    phaseAtHalfFswDeg: loop.phaseAtHalfFswDeg,
    parts: partsResult(prepared, comp, snappedComp, series, snappedMargins),
    bode: loop.bode,
    checks: loop.checks,
  };
};
