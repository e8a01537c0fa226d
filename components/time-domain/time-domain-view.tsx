'use client';

import { useMemo, useState } from 'react';
import { preparePlant } from '@/lib/engine/analyze';
import { closedLoopResponses } from '@/lib/engine/closed-loop';
import { simulateStepResponse } from '@/lib/engine/step-response';
import { EngineInputError, type AnalyzeRequest, type BodeData, type StepDefinition } from '@/lib/engine/types';
import { stepOf } from '@/lib/step-summary';
import { formatSi } from '@/lib/units/si';
import { ClosedLoopPanel } from './closed-loop-panel';
import { ModelCheckPlot, ModelCheckTable } from './model-check-plot';
import { StepForm } from './step-form';
import { StepPlot, StepReadouts } from './step-panel';
import { SwitchingJobError, useSwitchingJob } from './switching-job';
import { Card } from '@/components/ui/card';


const attempt = <T,>(f: () => T): { ok: true; value: T } | { ok: false; message: string } => {
  try {
    return { ok: true, value: f() };
  } catch (err) {
    return { ok: false, message: err instanceof EngineInputError ? err.issues.map((i) => i.message).join('; ') : err instanceof Error ? err.message : String(err) };
  }
};

/**
 * Tune's closed-loop view: output impedance and line rejection with the loop closed, the
 * load- or line-step response, and the switching check of the averaged model.
 */
export function TimeDomainView({ input, bode, readOnly, onStepChange }: { input: AnalyzeRequest; bode: BodeData | null; readOnly: boolean; onStepChange: (s: StepDefinition) => void }) {
  const [mainsHz, setMainsHz] = useState<50 | 60>(50);
  const step = useMemo(() => stepOf(input), [input]);
  const prepared = useMemo(() => attempt(() => preparePlant(input)), [input]);
  const closed = useMemo(() => (prepared.ok ? attempt(() => closedLoopResponses(prepared.value, input.compensator, mainsHz)) : null), [prepared, input.compensator, mainsHz]);
  const response = useMemo(() => attempt(() => simulateStepResponse(input, step)), [input, step]);
  const job = useSwitchingJob();
  const outcome = job.data ?? null;
  const switchingStep = outcome?.kind === 'step' ? outcome : null;
  const modelCheck = outcome?.kind === 'injection' ? outcome : null;
  const jobError = job.error instanceof SwitchingJobError ? job.error : job.error ? new SwitchingJobError(String(job.error), []) : null;

  return (
    <div className="space-y-4" data-testid="time-domain-view">
      <Card title="Closed loop">
        {closed?.ok ? <ClosedLoopPanel responses={closed.value} mainsHz={mainsHz} onMainsHz={setMainsHz} /> : <p className="text-sm text-slate-500">{closed && !closed.ok ? closed.message : prepared.ok ? '' : prepared.message}</p>}
      </Card>
      <Card title="Step response" aside={<span className="text-xs text-slate-500">averaged small-signal model, loop closed</span>}>
        <div className="space-y-3">
          <StepForm value={step} readOnly={readOnly} onChange={onStepChange} />
          {response.ok ? (
            <>
              <StepPlot step={response.value} switching={switchingStep} />
              <StepReadouts step={response.value} />
            </>
          ) : (
            <p className="text-sm text-red-700" role="alert" data-testid="step-problem">
              {response.message}
            </p>
          )}
        </div>
      </Card>
      <Card title="Switching check" aside={<span className="text-xs text-slate-500">cycle by cycle, in your browser</span>}>
        <div className="space-y-3">
          <p className="text-sm text-slate-600">
            Simulates the switching circuit itself (switch on, off and DCM intervals, the compensator and the {input.converter.topology} modulator) to show how far the averaged model holds: small sine waves injected into the loop read the loop gain the way a network analyzer would, and the step above runs cycle by cycle with its ripple.
          </p>
          <div className="flex flex-wrap items-center gap-2">
            <button type="button" className="btn-primary" disabled={job.isPending || !prepared.ok} onClick={() => job.mutate({ kind: 'injection', request: input })} data-testid="run-model-check">
              Check the model (6 frequencies)
            </button>
            <button type="button" className="btn-secondary" disabled={job.isPending || !response.ok} onClick={() => job.mutate({ kind: 'step', request: input, step })} data-testid="run-switching-step">
              Run the step cycle by cycle
            </button>
            {job.isPending && (
              <button type="button" className="btn-secondary" onClick={job.cancel}>
                Cancel
              </button>
            )}
          </div>
          {job.progress && (
            <div data-testid="switching-progress" data-computed-in={job.via ?? 'starting'} role="progressbar" aria-valuemin={0} aria-valuemax={100} aria-valuenow={Math.round(job.progress.fraction * 100)}>
              <div className="h-2 w-full overflow-hidden rounded bg-slate-200">
                <div className="h-2 bg-indigo-600 transition-all" style={{ width: `${Math.max(3, job.progress.fraction * 100)}%` }} />
              </div>
              <p className="mt-1 text-xs text-slate-500">Simulating: {job.progress.message}</p>
            </div>
          )}
          {jobError && (
            <p className="text-sm text-red-700" role="alert">
              {jobError.issues[0]?.message ?? jobError.message}
            </p>
          )}
          {modelCheck && bode && (
            <>
              <ModelCheckPlot bode={bode} points={modelCheck.points} />
              <ModelCheckTable points={modelCheck.points} />
              <p className="text-xs text-slate-500" data-testid="model-check-summary" data-computed-in={job.via ?? undefined}>
                {modelCheck.cycleCount} switching cycles. Steady state: output ripple {formatSi(modelCheck.steadyState.voutRipplePp, 'V')} p-p, inductor ripple {formatSi(modelCheck.steadyState.inductorRipplePp, 'A')} p-p, duty {(modelCheck.steadyState.duty * 100).toFixed(2)} %
                {modelCheck.steadyState.dcm ? ', with DCM intervals' : ''}. The averaged model is expected to hold well below fsw/10 and to depart toward fsw/2; switching ripple that reaches the comparator through the compensator (e.g. ESR steps of a boost's output) adds a feedback of the inductor current the averaged model lacks, which shows as errors even at low frequency.
              </p>
            </>
          )}
          {switchingStep && (
            <p className="text-xs text-slate-500" data-testid="switching-step-summary">
              Step simulated over {switchingStep.cycleCount} cycles and drawn over the averaged response above (grey).{' '}
              {switchingStep.outsideModel.length > 0 ? switchingStep.outsideModel.join('; ') + '.' : 'No saturated duty and no DCM in the switching run.'}
            </p>
          )}
        </div>
      </Card>
    </div>
  );
}
