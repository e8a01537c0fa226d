'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { memo, useEffect, useRef } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { parseSi } from '@/lib/units/si';
import type { MarginTargets, OperatingRange } from '@/lib/engine/range';
import type { FieldIssue } from '@/lib/engine/types';
import { TextField } from '@/components/tune/text-field';

type Field = 'vinMin' | 'vinMax' | 'ioutMin' | 'ioutMax' | 'lTol' | 'cTol' | 'rcMin' | 'rcMax' | 'rTol' | 'capTol' | 'pm' | 'gm';

interface Spec {
  name: Field;
  label: string;
  unit: string;
  /** Engine path of the value, for its 422 messages. */
  path: string;
  /** Shown in % while stored as a fraction. */
  percent?: boolean;
  /** Empty = the parts series' own tolerance. */
  optional?: boolean;
  /** Zero allowed (ESR, tolerances, targets). */
  zero?: boolean;
}

const FIELDS: readonly Spec[] = [
  { name: 'vinMin', label: 'Input voltage, low line', unit: 'V', path: 'range.vin.min' },
  { name: 'vinMax', label: 'Input voltage, high line', unit: 'V', path: 'range.vin.max' },
  { name: 'ioutMin', label: 'Load current, light', unit: 'A', path: 'range.iout.min' },
  { name: 'ioutMax', label: 'Load current, full', unit: 'A', path: 'range.iout.max' },
  { name: 'lTol', label: 'Inductance tolerance ±', unit: '%', path: 'range.l.tol', percent: true, zero: true },
  { name: 'cTol', label: 'Capacitance tolerance ±', unit: '%', path: 'range.c.tol', percent: true, zero: true },
  { name: 'rcMin', label: 'ESR, hot (lowest)', unit: 'Ω', path: 'range.rc.min', zero: true },
  { name: 'rcMax', label: 'ESR, cold (highest)', unit: 'Ω', path: 'range.rc.max', zero: true },
  { name: 'rTol', label: 'Compensator resistors ±', unit: '%', path: 'range.parts.resistorTol', percent: true, optional: true, zero: true },
  { name: 'capTol', label: 'Compensator capacitors ±', unit: '%', path: 'range.parts.capacitorTol', percent: true, optional: true, zero: true },
  { name: 'pm', label: 'Phase margin target', unit: '°', path: 'targets.phaseMarginDeg', zero: true },
  { name: 'gm', label: 'Gain margin target', unit: 'dB', path: 'targets.gainMarginDb', zero: true },
];

const numberText = (s: Spec) =>
  z
    .string()
    .trim()
    .transform((text, ctx) => {
      if (text === '') {
        if (s.optional) return null;
        ctx.addIssue({ code: 'custom', message: `${s.label} is required` });
        return z.NEVER;
      }
      const v = parseSi(text);
      if (v === null) {
        ctx.addIssue({ code: 'custom', message: `${s.label}: "${text}" is not a number` });
        return z.NEVER;
      }
      if (s.zero ? v < 0 : !(v > 0)) {
        ctx.addIssue({ code: 'custom', message: `${s.label} must be ${s.zero ? '0 or more' : 'above 0'} ${s.unit}` });
        return z.NEVER;
      }
      if (s.percent && v >= 100) {
        ctx.addIssue({ code: 'custom', message: `${s.label} must be under 100 %` });
        return z.NEVER;
      }
      return s.percent ? v / 100 : v;
    });

const formSchema = z
  .object(Object.fromEntries(FIELDS.map((f) => [f.name, numberText(f)])) as Record<Field, ReturnType<typeof numberText>>)
  .refine((v) => v.vinMax === null || v.vinMin === null || v.vinMax >= v.vinMin, { path: ['vinMax'], message: 'High line must be at least the low line' })
  .refine((v) => v.ioutMax === null || v.ioutMin === null || v.ioutMax >= v.ioutMin, { path: ['ioutMax'], message: 'Full load must be at least the light load' })
  .refine((v) => v.rcMax === null || v.rcMin === null || v.rcMax >= v.rcMin, { path: ['rcMax'], message: 'Cold ESR must be at least the hot ESR' });

type Text = z.input<typeof formSchema>;
type Values = z.output<typeof formSchema>;

const show = (v: number, percent?: boolean) => String(Number((percent ? v * 100 : v).toPrecision(6)));

const toText = (r: OperatingRange, t: MarginTargets): Text => ({
  vinMin: show(r.vin.min),
  vinMax: show(r.vin.max),
  ioutMin: show(r.iout.min),
  ioutMax: show(r.iout.max),
  lTol: show(r.l.tol, true),
  cTol: show(r.c.tol, true),
  rcMin: show(r.rc.min),
  rcMax: show(r.rc.max),
  rTol: r.parts ? show(r.parts.resistorTol, true) : '',
  capTol: r.parts ? show(r.parts.capacitorTol, true) : '',
  pm: show(t.phaseMarginDeg),
  gm: show(t.gainMarginDb),
});

const fromValues = (v: Values, seriesTol: { resistorTol: number; capacitorTol: number }): { range: OperatingRange; targets: MarginTargets } => ({
  range: {
    vin: { min: v.vinMin!, max: v.vinMax! },
    iout: { min: v.ioutMin!, max: v.ioutMax! },
    l: { tol: v.lTol! },
    c: { tol: v.cTol! },
    rc: { min: v.rcMin!, max: v.rcMax! },
    // Both empty: follow the parts series; one given: the other keeps the series' value.
    ...(v.rTol === null && v.capTol === null ? {} : { parts: { resistorTol: v.rTol ?? seriesTol.resistorTol, capacitorTol: v.capTol ?? seriesTol.capacitorTol } }),
  },
  targets: { phaseMarginDeg: v.pm!, gainMarginDb: v.gm! },
});

export interface RangeFormProps {
  range: OperatingRange;
  targets: MarginTargets;
  /** The parts series' own tolerances, shown when the compensator fields are empty. */
  seriesTol: { resistorTol: number; capacitorTol: number };
  readOnly: boolean;
  issues: FieldIssue[];
  onChange: (next: { range: OperatingRange; targets: MarginTargets }) => void;
}

/** The operating range and margin targets, saved with the revision. Checked as typed. */
export const RangeForm = memo(function RangeForm({ range, targets, seriesTol, readOnly, issues, onChange }: RangeFormProps) {
  const start = useRef(toText(range, targets));
  const {
    register,
    watch,
    formState: { errors },
  } = useForm<Text, unknown, Values>({ resolver: zodResolver(formSchema), mode: 'onChange', defaultValues: start.current });
  const latest = useRef({ onChange, seriesTol });
  latest.current = { onChange, seriesTol };

  useEffect(() => {
    const sub = watch((text) => {
      const r = formSchema.safeParse(text);
      if (r.success) latest.current.onChange(fromValues(r.data, latest.current.seriesTol));
    });
    return () => sub.unsubscribe();
  }, [watch]);

  const placeholder = (f: Spec) =>
    f.name === 'rTol' ? `${show(seriesTol.resistorTol, true)} (series)` : f.name === 'capTol' ? `${show(seriesTol.capacitorTol, true)} (series)` : undefined;

  return (
    <fieldset className="grid grid-cols-2 gap-x-3 gap-y-2" disabled={readOnly} aria-label="Operating range" data-testid="range-form">
      {FIELDS.map((f) => (
        <TextField
          key={f.name}
          id={`range-${f.name}`}
          label={f.label}
          unit={f.unit}
          error={errors[f.name]?.message ?? issues.find((i) => i.path === f.path)?.message}
          placeholder={placeholder(f)}
          {...register(f.name)}
        />
      ))}
    </fieldset>
  );
});
