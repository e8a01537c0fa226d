'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { memo, useEffect, useRef } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { RANGE_INPUTS, RANGE_ORDER_MESSAGES, type RangeFormField, type RangeInputSpec } from '@/lib/catalog/range-inputs';
import { parseSi } from '@/lib/units/si';
import type { MarginTargets, OperatingRange } from '@/lib/engine/range';
import type { FieldIssue } from '@/lib/engine/types';
import { TextField } from '@/components/tune/text-field';

type Field = RangeFormField;
type Spec = RangeInputSpec;
const FIELDS = RANGE_INPUTS;

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
  .refine((v) => v.vinMax === null || v.vinMin === null || v.vinMax >= v.vinMin, { path: ['vinMax'], message: RANGE_ORDER_MESSAGES.vinMax })
  .refine((v) => v.ioutMax === null || v.ioutMin === null || v.ioutMax >= v.ioutMin, { path: ['ioutMax'], message: RANGE_ORDER_MESSAGES.ioutMax })
  .refine((v) => v.rcMax === null || v.rcMin === null || v.rcMax >= v.rcMin, { path: ['rcMax'], message: RANGE_ORDER_MESSAGES.rcMax });

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
