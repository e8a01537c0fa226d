'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { memo, useEffect, useRef } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import type { Amplifier, CompensatorInput } from '@/lib/engine/types';
import { AMPLIFIER_OPTIONS } from '@/lib/catalog';
import { siText, toSiText } from './si-schema';
import { TextField } from './text-field';

/** What the amplifier fields set; the placed poles and zeros stay where they are. */
export type AmplifierValues = Pick<CompensatorInput, 'amplifier' | 'gm' | 'ro' | 'rb' | 'opamp'>;

/** An optional SI field: empty means absent (ideal op-amp, infinite ro). */
const optionalSi = (label: string, unit: string) =>
  z.union([z.literal('').transform(() => undefined), siText(label, unit)]);

const schema = z.object({
  gm: siText('Transconductance gm', 'S'),
  ro: optionalSi('Output resistance ro', 'Ω'),
  rb: siText('Divider bottom Rb', 'Ω'),
  a0: optionalSi('Op-amp gain a0', 'V/V'),
  gbw: optionalSi('Op-amp GBW', 'Hz'),
});
type Text = z.input<typeof schema>;
type Values = z.output<typeof schema>;

const textOf = (c: CompensatorInput, rbDefault: number): Text => ({
  gm: toSiText(c.gm ?? 1e-3),
  ro: toSiText(c.ro),
  rb: toSiText(c.rb ?? rbDefault),
  a0: toSiText(c.opamp?.a0),
  gbw: toSiText(c.opamp?.gbw),
});

const valuesFor = (amplifier: Amplifier, v: Values): AmplifierValues =>
  amplifier === 'transconductance'
    ? { amplifier, gm: v.gm, rb: v.rb, ...(v.ro !== undefined ? { ro: v.ro } : {}) }
    : v.a0 !== undefined && v.gbw !== undefined
      ? { amplifier, opamp: { a0: v.a0, gbw: v.gbw } }
      : { amplifier };

const FIELDS: Record<Amplifier, { name: keyof Text; label: string; unit: string; hint?: string }[]> = {
  opamp: [
    { name: 'a0', label: 'Op-amp gain a0', unit: 'V/V', hint: 'empty = ideal' },
    { name: 'gbw', label: 'Op-amp GBW', unit: 'Hz', hint: 'empty = ideal' },
  ],
  transconductance: [
    { name: 'gm', label: 'Transconductance gm', unit: 'S' },
    { name: 'ro', label: 'Output resistance ro', unit: 'Ω', hint: 'empty = infinite' },
    { name: 'rb', label: 'Divider bottom Rb', unit: 'Ω' },
  ],
};

/**
 * The error amplifier: an op-amp stage (ideal, or a0 and GBW) or a transconductance amplifier
 * (gm, ro, and the divider's Rb, which is then part of the loop). A change keeps the placed
 * poles and zeros; the parts follow.
 */
export const AmplifierForm = memo(function AmplifierForm({
  compensator,
  rbDefault,
  readOnly,
  onChange,
}: {
  compensator: CompensatorInput;
  /** Rb that sets vout from vref with this R1 (the starting value for a gm stage). */
  rbDefault: number;
  readOnly: boolean;
  /** Apply amplifier values; returns why they cannot be used, or null. */
  onChange: (values: AmplifierValues) => string | null;
}) {
  const amplifier: Amplifier = compensator.amplifier ?? 'opamp';
  const {
    register,
    watch,
    getValues,
    setError,
    formState: { errors },
  } = useForm<Text, unknown, Values>({ resolver: zodResolver(schema), mode: 'onChange', defaultValues: textOf(compensator, rbDefault) });
  const cb = useRef(onChange);
  cb.current = onChange;

  useEffect(() => {
    const sub = watch((text) => {
      const r = schema.safeParse(text);
      if (!r.success) return;
      const problem = cb.current(valuesFor(amplifier, r.data));
      if (problem) setError('gm', { message: problem });
    });
    return () => sub.unsubscribe();
  }, [watch, amplifier, setError]);

  const onAmplifier = (next: Amplifier) => {
    const r = schema.safeParse(getValues());
    const problem = r.success ? cb.current(valuesFor(next, r.data)) : 'fix the amplifier fields first';
    if (problem) setError('gm', { message: problem });
  };

  return (
    <fieldset className="space-y-2" disabled={readOnly} aria-label="Error amplifier">
      <label className="block" htmlFor="amplifier-kind">
        <span className="label">Error amplifier</span>
        <select id="amplifier-kind" data-testid="amplifier" className="input" value={amplifier} onChange={(e) => onAmplifier(e.target.value as Amplifier)}>
          {AMPLIFIER_OPTIONS.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </select>
      </label>
      <div className="grid grid-cols-2 gap-x-3 gap-y-2">
        {FIELDS[amplifier].map((f) => (
          <TextField key={f.name} id={`amp-${f.name}`} label={f.label} unit={f.unit} placeholder={f.hint} error={errors[f.name]?.message} {...register(f.name)} />
        ))}
      </div>
      {errors.gm && amplifier === 'opamp' && (
        <p className="text-xs text-amber-800" role="status" data-testid="amplifier-note">
          {errors.gm.message}
        </p>
      )}
    </fieldset>
  );
});
