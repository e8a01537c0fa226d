/**
 * Public API of the analysis engine (pure TypeScript: no framework, no database).
 *
 * Full analysis:  analyze(request) → AnalyzeResult (POST /api/analyze).
 * Tune drag loop: preparePlant(request) once, then for each handle move
 *                 analyzeLoop(prepared, partsFromShape(shape)).
 */
export * from './types';
export { analyze, analyzeLoop, analyzeParts, evaluateLoopGain, preparePlant, marginsForCompensator, snapCompensator, partValues } from './analyze';
export type { PreparedPlant, LoopResult, StageRequest } from './analyze';
export {
  compensatorImpedances,
  compensatorTransfer,
  dividerRb,
  integratorHz,
  partsFromShape,
  shapeFromParts,
  summarizeCompensator,
} from './compensator';
export { evalPoly, evalPolyJw, polyMul, polyRoots, polyTrim } from './complex-poly';
export type { Poly } from './complex-poly';
export { seriesValues, snapToSeries } from './eseries';
export { computeMargins, computeMarginsFromComplex, findCrossings, interpolateLogF, unwrapPhase } from './margins';
export type { LoopPointEvaluator, SampledResponse } from './margins';
export { buildPlantModel, modulatedPlant, summarizePlant } from './plant';
export type { PlantModel } from './plant';
export { SAMPLE_DESIGNS } from './samples';
export type { SampleDesign } from './samples';
export { buildSpiceNetlist } from './spice-netlist';
export type { SpiceNetlistOptions } from './spice-netlist';
export { kFactorParts, proposeCompensator, proposeForPlant } from './starting-point';
export type { KFactorInput, StartingPointMethod, StartingPointTarget } from './starting-point';
export { computeDuty, computeOperatingPoint } from './steady-state';
export { defaultSweep, logSweep, sweepTransfer, transferEvaluator, transferResponse } from './sweep';
export {
  dbFromMag,
  dbFromMagSq,
  evaluateTransfer,
  multiplyTransfers,
  scaleTransfer,
  transferFromPolys,
  summarizeTransfer,
  transferPolys,
  wrapDeg,
} from './transfer';
export type { SectionedTransfer } from './transfer';
export { loopChecks, partChecks, stageChecks } from './checks';
export { compensatorIssues, stageIssues, validateRequest } from './validate';
export { closedLoopResponses, complexAt, loopBlocks } from './closed-loop';
export type { ClosedLoopResponses } from './closed-loop';
export { simulateLoopStep, stepMetrics } from './linear-loop';
export type { LoopBlocks, LoopInput, LoopStepInput, LoopTimeResponse, StepMetrics } from './linear-loop';
export { DEFAULT_STEP_BAND, isVoltageMode, simulateStepResponse, stageBeforeStep } from './step-response';
export type { StepDefinition, StepKind, StepResponseResult } from './step-response';
export { createSwitchingSim } from './switching';
export type { CycleRecord, Sample, SwitchControl, SwitchingSetup, SwitchingSim } from './switching';
export {
  MAX_INJECTIONS,
  MAX_SWITCHING_CYCLES,
  defaultInjectionHz,
  estimateCheckCycles,
  estimateStepCycles,
  measureSteadyState,
  modelCheck,
  simulatorFor,
  switchControlOf,
  switchingStep,
} from './switching-check';
export type { ModelCheckPoint, ModelCheckResult, ProgressFn, SteadyStateSummary, SwitchingStepResult, Waveform } from './switching-check';
export { BODE_SIGNIFICANT_DIGITS, roundBode, roundSignificant } from './precision';
