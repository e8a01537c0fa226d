'use client';

import { useForm } from 'react-hook-form';
import type { SpreadDistribution, SpreadResult } from '@/lib/engine/spread';
import type { MarginTargets } from '@/lib/engine/range';
import { Histogram } from './histogram';
import { useSpreadProgress, type SpreadState } from './use-spread';
import { formatCount } from '@/lib/format';

interface SpreadForm {
  samples: string;
  seed: string;
  distribution: SpreadDistribution;
}

export interface SpreadRequest {
  samples: number;
  seed: number;
  distribution: SpreadDistribution;
}

const SAMPLE_CHOICES = ['1000', '10000', '100000'];

/** Controls, progress and histograms of the tolerance spread (run in a Web Worker). */
export function SpreadPanel({
  state,
  stale,
  targets,
  onRun,
  onCancel,
}: {
  state: SpreadState;
  /** The design changed since the shown result was computed. */
  stale: boolean;
  targets: MarginTargets;
  onRun: (r: SpreadRequest) => void;
  onCancel: () => void;
}) {
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<SpreadForm>({ defaultValues: { samples: '10000', seed: '1', distribution: 'uniform' } });
  const running = state.status === 'running';
  const done = useSpreadProgress(state.status === 'running' ? state.progress : null);
  const submit = handleSubmit((v) => onRun({ samples: Number(v.samples), seed: Number(v.seed), distribution: v.distribution }));
  const result: SpreadResult | null = state.status === 'done' ? state.result : null;

  return (
    <div className="space-y-3" data-testid="spread-panel">
      <form className="flex flex-wrap items-end gap-3" onSubmit={submit} aria-label="Tolerance spread">
        <div>
          <label className="label normal-case tracking-normal" htmlFor="spread-samples">
            Samples
          </label>
          <select id="spread-samples" className="input w-28" disabled={running} {...register('samples')}>
            {SAMPLE_CHOICES.map((n) => (
              <option key={n} value={n}>
                {formatCount(Number(n))}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label className="label normal-case tracking-normal" htmlFor="spread-seed">
            Seed
          </label>
          <input
            id="spread-seed"
            className={`input num w-24 font-mono ${errors.seed ? 'input-error' : ''}`}
            inputMode="numeric"
            disabled={running}
            {...register('seed', { validate: (v) => /^\d{1,10}$/.test(v.trim()) || 'Seed: a whole number, 0 or more' })}
          />
        </div>
        <fieldset className="flex items-center gap-3 text-sm" disabled={running}>
          <legend className="label normal-case tracking-normal">Distribution</legend>
          <label className="inline-flex items-center gap-1">
            <input type="radio" value="uniform" {...register('distribution')} /> uniform
          </label>
          <label className="inline-flex items-center gap-1" title="The tolerance read as ±3σ, parts outside it rejected">
            <input type="radio" value="normal" {...register('distribution')} /> normal (tol = 3σ)
          </label>
        </fieldset>
        {/* Keys keep these two apart: were one <button> reused, the click on Cancel would end with
            the element already turned into the submit button, and the form would start a new run. */}
        {running ? (
          <button key="cancel" type="button" className="btn-secondary" onClick={onCancel} data-testid="spread-cancel">
            Cancel
          </button>
        ) : (
          <button key="run" type="submit" className="btn-primary" data-testid="spread-run">
            Run spread
          </button>
        )}
      </form>
      {errors.seed && (
        <p className="field-error" role="alert">
          {errors.seed.message}
        </p>
      )}
      {state.status === 'running' && (
        <div role="progressbar" aria-label="Spread progress" aria-valuemin={0} aria-valuemax={state.total} aria-valuenow={done} data-testid="spread-progress">
          <div className="h-2 overflow-hidden rounded bg-slate-200">
            <div className="h-full bg-indigo-600 transition-[width]" style={{ width: `${(100 * done) / state.total}%` }} />
          </div>
          <p className="mt-1 text-xs text-slate-600">
            {formatCount(done)} of {formatCount(state.total)} samples
          </p>
        </div>
      )}
      {state.status === 'cancelled' && (
        <p className="text-xs text-slate-600" data-testid="spread-cancelled">
          Spread cancelled after {formatCount(state.done)} of {formatCount(state.total)} samples; nothing kept. Run it again to see the histograms.
        </p>
      )}
      {state.status === 'error' && (
        <p className="field-error" role="alert">
          The spread could not run: {state.message}
        </p>
      )}
      {result && state.status === 'done' && (
        <div className="space-y-2" data-testid="spread-result">
          <p className="text-xs text-slate-600">
            {formatCount(result.samples)} samples, {result.distribution} distribution, seed {result.seed}, at {result.conditions.vin} V and{' '}
            {result.conditions.iout} A; L ±{(result.tolerances.l * 100).toFixed(1)} %, C ±{(result.tolerances.c * 100).toFixed(1)} %, ESR {result.tolerances.rc.min}–
            {result.tolerances.rc.max} Ω, resistors ±{(result.tolerances.resistorTol * 100).toFixed(1)} %, capacitors ±{(result.tolerances.capacitorTol * 100).toFixed(1)} %. Took{' '}
            {(state.elapsedMs / 1000).toFixed(2)} s.
            {stale && <strong className="ml-1 text-amber-800">The design has changed since: run again.</strong>}
          </p>
          <div className="grid gap-2 md:grid-cols-3">
            {result.histograms.phaseMarginDeg && (
              <Histogram title="Phase margin" unit="°" data={result.histograms.phaseMarginDeg} percentiles={result.percentiles.phaseMarginDeg} target={targets.phaseMarginDeg} testId="hist-pm" />
            )}
            {result.histograms.gainMarginDb ? (
              <Histogram title="Gain margin" unit="dB" data={result.histograms.gainMarginDb} percentiles={result.percentiles.gainMarginDb} target={targets.gainMarginDb} testId="hist-gm" />
            ) : (
              <p className="self-center text-xs text-slate-500">No sample reaches −180°: no gain margin to lose.</p>
            )}
            {result.histograms.crossoverHz && (
              <Histogram title="Crossover fc" unit="kHz" scale={1e-3} data={result.histograms.crossoverHz} percentiles={result.percentiles.crossoverHz} testId="hist-fc" />
            )}
          </div>
          <p className="text-[11px] text-slate-500">Dotted lines: 1st, 50th and 99th percentiles; red: the margin target.</p>
        </div>
      )}
    </div>
  );
}
