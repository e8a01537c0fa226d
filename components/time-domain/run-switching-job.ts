import { modelCheck, switchingStep, type ModelCheckResult, type SwitchingStepResult } from '@/lib/engine/switching-check';
import type { AnalyzeRequest, StepDefinition } from '@/lib/engine/types';

export type SwitchingJob =
  | { kind: 'injection'; request: AnalyzeRequest; frequencies?: number[] }
  | { kind: 'step'; request: AnalyzeRequest; step: StepDefinition };

export type SwitchingOutcome = ({ kind: 'injection' } & ModelCheckResult) | ({ kind: 'step' } & SwitchingStepResult);

/** The job itself (the worker runs this; so does the page when no worker can start). */
export const runSwitchingJob = (job: SwitchingJob, progress?: (fraction: number, message: string) => void): SwitchingOutcome =>
  job.kind === 'injection'
    ? { kind: 'injection', ...modelCheck(job.request, job.frequencies, progress) }
    : { kind: 'step', ...switchingStep(job.request, job.step, progress) };

