'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import type { StartingPointMethod } from '@/lib/engine/starting-point';
import { compensatorLabel } from '@/lib/catalog/compensators';
import { COMPENSATOR_TYPES, type CompensatorType } from '@/lib/engine/types';
import { siText, toSiText } from './si-schema';
import { TextField } from './text-field';

const schema = z.object({
  crossoverHz: siText('Target crossover fc', 'Hz'),
  phaseMarginDeg: z
    .string()
    .trim()
    .min(1, 'Target phase margin is required')
    .transform((t, ctx) => {
      const v = Number(t.replace(/°$/, ''));
      if (!Number.isFinite(v)) {
        ctx.addIssue({ code: 'custom', message: `Target phase margin: "${t}" is not a number of degrees` });
        return z.NEVER;
      }
      if (v <= 0 || v >= 90) {
        ctx.addIssue({ code: 'custom', message: 'Target phase margin must lie between 0° and 90°' });
        return z.NEVER;
      }
      return v;
    }),
  method: z.enum(['k-factor', 'pole-zero']),
  type: z.enum(COMPENSATOR_TYPES),
});

type Text = z.input<typeof schema>;
export type StartingPointRequest = z.output<typeof schema>;

interface Props {
  /** Default target fc for the stage as it is now (followed until the designer types one). */
  defaultCrossoverHz: number;
  /** Starting phase margin target, degrees. */
  defaultPhaseMarginDeg?: number;
  type: CompensatorType;
  /** The phase margin target as typed, degrees (null while it is not a number); a type change keeps it. */
  onPhaseMarginTarget?: (deg: number | null) => void;
  /** Replace the compensator; returns the reason it could not be placed, or null. */
  onPropose: (target: StartingPointRequest) => string | null;
}

/** Starting point: target fc and PM and a placement method give an editable compensator. */
export function StartingPointForm({ defaultCrossoverHz, defaultPhaseMarginDeg = 60, type, onPropose, onPhaseMarginTarget }: Props) {
  const {
    register,
    handleSubmit,
    setError,
    resetField,
    getFieldState,
    watch,
    formState: { errors, isSubmitSuccessful, dirtyFields },
  } = useForm<Text, unknown, StartingPointRequest>({
    resolver: zodResolver(schema),
    defaultValues: { crossoverHz: toSiText(defaultCrossoverHz, 3), phaseMarginDeg: String(defaultPhaseMarginDeg), method: 'k-factor', type },
  });
  const method = watch('method');
  const pmText = watch('phaseMarginDeg');
  const fcTyped = Boolean(dirtyFields.crossoverHz);

  // The target fc follows the stage (fsw, RHP zero) until the designer types one.
  useEffect(() => {
    if (!getFieldState('crossoverHz').isDirty) resetField('crossoverHz', { defaultValue: toSiText(defaultCrossoverHz, 3) });
  }, [defaultCrossoverHz, getFieldState, resetField]);

  useEffect(() => {
    const v = Number(String(pmText).replace(/°$/, ''));
    onPhaseMarginTarget?.(Number.isFinite(v) && v > 0 && v < 90 ? v : null);
  }, [pmText, onPhaseMarginTarget]);

  const submit = handleSubmit((values) => {
    const problem = onPropose(values);
    if (problem) setError('root', { message: problem });
  });

  return (
    <form onSubmit={submit} noValidate className="space-y-2" aria-label="Starting point">
      <div className="grid grid-cols-2 gap-2">
        <TextField id="sp-fc" label="Target fc" unit="Hz" error={errors.crossoverHz?.message} {...register('crossoverHz')} />
        <TextField id="sp-pm" label="Target PM" unit="°" error={errors.phaseMarginDeg?.message} {...register('phaseMarginDeg')} />
        <div>
          <label className="label normal-case tracking-normal" htmlFor="sp-method">
            Method
          </label>
          <select id="sp-method" className="input" {...register('method')}>
            <option value={'k-factor' satisfies StartingPointMethod}>K factor</option>
            <option value={'pole-zero' satisfies StartingPointMethod}>Pole-zero rules</option>
          </select>
        </div>
        <div>
          <label className="label normal-case tracking-normal" htmlFor="sp-type">
            Type
          </label>
          <select id="sp-type" className="input" {...register('type')}>
            {COMPENSATOR_TYPES.map((t) => (
              <option key={t} value={t}>
                {compensatorLabel(t)}
              </option>
            ))}
          </select>
        </div>
      </div>
      <p className="text-[11px] text-slate-500" data-testid="sp-fc-source">
        {fcTyped ? (
          <>
            Target fc as typed.{' '}
            <button type="button" className="text-indigo-700 underline" onClick={() => resetField('crossoverHz', { defaultValue: toSiText(defaultCrossoverHz, 3) })}>
              Back to the default ({toSiText(defaultCrossoverHz, 3)}Hz)
            </button>
          </>
        ) : (
          'Target fc follows the stage: the lower of fsw/10 and a third of the RHP zero (common practice).'
        )}
      </p>
      <p className="text-[11px] text-slate-500">
        {method === 'k-factor'
          ? 'K factor: the boost needed for the target PM at fc sets where the zeros and poles sit.'
          : 'Pole-zero rules: zeros at the LC resonance, poles at the ESR zero and fsw/2, gain set for fc. The target PM is not used.'}
      </p>
      {errors.root && (
        <p className="field-error" role="alert">
          {errors.root.message}
        </p>
      )}
      {isSubmitSuccessful && !errors.root && <p className="text-xs text-emerald-700">Compensator placed; drag or edit it from here.</p>}
      <button type="submit" className="btn-secondary" data-testid="starting-point-apply">
        Place compensator
      </button>
    </form>
  );
}
