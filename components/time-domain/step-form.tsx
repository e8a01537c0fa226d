'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { siText, toSiText } from '@/components/tune/si-schema';
import { TextField } from '@/components/tune/text-field';
import type { StepDefinition } from '@/lib/engine/types';
import { parseSi } from '@/lib/units/si';

const schema = z.object({
  kind: z.enum(['load', 'line']),
  from: siText('Before the step', ''),
  to: siText('After the step', '', 'nonNegative'),
  slewTime: z
    .string()
    .trim()
    .transform((t, ctx) => {
      if (t === '' || t === '0') return null;
      const v = parseSi(t.replace(/s$/, ''));
      if (v === null || !(v > 0)) {
        ctx.addIssue({ code: 'custom', message: `Rise time: "${t}" is not a time (try 1u or 10us; empty for an ideal step)` });
        return z.NEVER;
      }
      return v;
    }),
  bandPct: z
    .string()
    .trim()
    .transform((t, ctx) => {
      const v = Number(t.replace(/%$/, ''));
      if (!Number.isFinite(v) || v <= 0 || v >= 50) {
        ctx.addIssue({ code: 'custom', message: 'Settling band must be between 0 and 50 % of vout' });
        return z.NEVER;
      }
      return v;
    }),
});

type Text = z.input<typeof schema>;

/** The step in the units the form shows: rise time instead of slew, band in percent. */
const toText = (s: StepDefinition): Text => ({
  kind: s.kind,
  from: toSiText(s.from),
  to: toSiText(s.to),
  slewTime: s.slew ? toSiText(Math.abs(s.to - s.from) / s.slew) : '',
  bandPct: String(Number(((s.band ?? 0.01) * 100).toPrecision(3))),
});

/** The step definition (react-hook-form): kind, before and after, rise time, settling band. */
export function StepForm({ value, readOnly, onChange }: { value: StepDefinition; readOnly: boolean; onChange: (s: StepDefinition) => void }) {
  const {
    register,
    handleSubmit,
    reset,
    watch,
    formState: { errors, isDirty },
  } = useForm<Text, unknown, z.output<typeof schema>>({ resolver: zodResolver(schema), defaultValues: toText(value), mode: 'onChange' });
  useEffect(() => reset(toText(value)), [value, reset]);
  const kind = watch('kind');
  const unit = kind === 'load' ? 'A' : 'V';
  const submit = handleSubmit((d) => {
    const delta = Math.abs(d.to - d.from);
    onChange({ kind: d.kind, from: d.from, to: d.to, slew: d.slewTime && delta > 0 ? delta / d.slewTime : null, band: d.bandPct / 100 });
  });
  return (
    <form onSubmit={submit} className="grid grid-cols-2 gap-3 sm:grid-cols-5" data-testid="step-form" aria-label="Step definition">
      <div>
        <label className="label normal-case tracking-normal" htmlFor="step-kind">
          Step
        </label>
        <select id="step-kind" className="input" disabled={readOnly} {...register('kind')}>
          <option value="load">Load (A)</option>
          <option value="line">Line, vin (V)</option>
        </select>
      </div>
      <TextField id="step-from" label="Before" unit={unit} disabled={readOnly} error={errors.from?.message} {...register('from')} />
      <TextField id="step-to" label="After" unit={unit} disabled={readOnly} error={errors.to?.message} {...register('to')} />
      <TextField id="step-rise" label="Rise time" unit="s, empty = ideal" disabled={readOnly} error={errors.slewTime?.message} {...register('slewTime')} />
      <TextField id="step-band" label="Settling band" unit="% of vout" disabled={readOnly} error={errors.bandPct?.message} {...register('bandPct')} />
      {!readOnly && (
        <div className="col-span-full">
          <button type="submit" className="btn-secondary" disabled={!isDirty} data-testid="step-apply">
            Apply step
          </button>
        </div>
      )}
    </form>
  );
}
