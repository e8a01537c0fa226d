'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { memo, useEffect, useRef } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import type { AnalyzeRequest, FieldIssue, ModulatorInput, ModulatorMode } from '@/lib/engine/types';
import { inputLabel, inputPath, MODE_OPTIONS, STAGE_INPUTS, type InputSpec } from '@/lib/catalog';
import { siText, toSiText } from './si-schema';
import { TextField } from './text-field';

type Stage = Pick<AnalyzeRequest, 'converter' | 'modulator' | 'feedback'>;

interface FieldSpec {
  name: StageField;
  label: string;
  unit: string;
  path: string;
  hint?: string;
  /** One line of help (the input's title). */
  help: string;
  bound?: 'positive' | 'nonNegative';
  /** Shown without a prefix (0.8 rather than 800m). */
  plain?: boolean;
  /** Only in these modulator modes; absent means always. */
  modes?: readonly ModulatorMode[];
}

type StageField = InputSpec['field'];

/** Labels, units, bounds and help from the catalogue of stage inputs. */
const FIELDS: readonly FieldSpec[] = STAGE_INPUTS.map((spec) => ({
  name: spec.field,
  label: inputLabel(spec),
  unit: spec.unit,
  path: inputPath(spec),
  hint: spec.zeroMeans ? `0 = ${spec.zeroMeans}` : undefined,
  help: spec.help,
  bound: spec.bound,
  plain: spec.plain,
  modes: spec.appliesTo?.modulator,
}));

const stageFormSchema = z.object(
  Object.fromEntries(FIELDS.map((f) => [f.name, siText(f.label, f.unit, f.bound)])) as Record<
    StageField,
    ReturnType<typeof siText>
  >,
);

type StageText = z.input<typeof stageFormSchema>;
type StageValues = z.output<typeof stageFormSchema>;

const numbersOf = (s: Stage): Record<StageField, number> => ({
  vin: s.converter.vin,
  vout: s.converter.vout,
  iout: s.converter.iout,
  fsw: s.converter.fsw,
  l: s.converter.l,
  rl: s.converter.rl ?? 0,
  c: s.converter.c,
  rc: s.converter.rc ?? 0,
  vd: s.converter.vd ?? 0,
  // The other mode's fields keep a starting value for when the designer switches to it.
  vramp: s.modulator.mode === 'peak-current' ? 1 : s.modulator.vramp,
  ri: s.modulator.mode === 'peak-current' ? s.modulator.ri : 0.1,
  se: s.modulator.mode === 'peak-current' ? s.modulator.se : 0,
  vref: s.feedback.vref,
});

const toText = (s: Stage): StageText => {
  const n = numbersOf(s);
  return Object.fromEntries(FIELDS.map((f) => [f.name, f.plain ? String(Number(n[f.name].toPrecision(6))) : toSiText(n[f.name], 6)])) as StageText;
};

/** The modulator for a mode; a voltage-mode modulator stays without `mode`, as saved designs have it. */
const modulatorOf = (v: StageValues, mode: ModulatorMode): ModulatorInput =>
  mode === 'peak-current' ? { mode, ri: v.ri, se: v.se } : { vramp: v.vramp };

const fromValues = (v: StageValues, topology: AnalyzeRequest['converter']['topology'], mode: ModulatorMode): Stage => ({
  converter: { topology, vin: v.vin, vout: v.vout, iout: v.iout, fsw: v.fsw, l: v.l, rl: v.rl, c: v.c, rc: v.rc, vd: v.vd },
  modulator: modulatorOf(v, mode),
  feedback: { vref: v.vref },
});

/** Fields whose text was not touched keep their exact starting value (the text may round it). */
const keepUntouched = (parsed: StageValues, text: Partial<StageText>, start: StageText, startValues: Record<StageField, number>): StageValues =>
  Object.fromEntries(FIELDS.map((f) => [f.name, text[f.name] === start[f.name] ? startValues[f.name] : parsed[f.name]])) as StageValues;

export interface StageFormProps {
  value: Stage;
  readOnly: boolean;
  /** Physical problems the engine found, by path ("converter.vout"), shown under their fields. */
  issues: FieldIssue[];
  onChange: (stage: Stage) => void;
  /** False while a field holds text that does not parse (the draft keeps its last good value). */
  onValidityChange: (valid: boolean) => void;
}

/** Power stage, modulator (voltage or peak current mode) and reference inputs; SI-prefix text, checked as typed. */
export const StageForm = memo(function StageForm({ value, readOnly, issues, onChange, onValidityChange }: StageFormProps) {
  const topology = value.converter.topology;
  const mode: ModulatorMode = value.modulator.mode ?? 'voltage';
  const start = useRef({ text: toText(value), values: numbersOf(value) });
  const {
    register,
    watch,
    getValues,
    formState: { errors },
  } = useForm<StageText, unknown, StageValues>({
    resolver: zodResolver(stageFormSchema),
    mode: 'onChange',
    defaultValues: start.current.text,
  });
  const callbacks = useRef({ onChange, onValidityChange });
  callbacks.current = { onChange, onValidityChange };

  useEffect(() => {
    const sub = watch((text) => {
      const r = stageFormSchema.safeParse(text);
      callbacks.current.onValidityChange(r.success);
      if (r.success) callbacks.current.onChange(fromValues(keepUntouched(r.data, text, start.current.text, start.current.values), topology, mode));
    });
    return () => sub.unsubscribe();
  }, [watch, topology, mode]);

  const onModeChange = (next: ModulatorMode) => {
    const text = getValues();
    const r = stageFormSchema.safeParse(text);
    if (r.success) callbacks.current.onChange(fromValues(keepUntouched(r.data, text, start.current.text, start.current.values), topology, next));
  };

  return (
    <fieldset className="grid grid-cols-2 gap-x-3 gap-y-2" disabled={readOnly} aria-label="Power stage">
      <label className="col-span-2 flex items-center gap-2 text-xs text-slate-600" htmlFor="stage-mode">
        Modulator
        <select id="stage-mode" data-testid="modulator-mode" className="input py-1 text-xs" value={mode} onChange={(e) => onModeChange(e.target.value as ModulatorMode)}>
          {MODE_OPTIONS.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </select>
      </label>
      {FIELDS.filter((f) => f.modes === undefined || f.modes.includes(mode)).map((f) => {
        const engineError = issues.find((i) => i.path === f.path)?.message;
        return (
          <TextField
            key={f.name}
            id={`stage-${f.name}`}
            label={f.label}
            unit={f.unit}
            error={errors[f.name]?.message ?? engineError}
            placeholder={f.hint}
            title={f.help}
            {...register(f.name)}
          />
        );
      })}
    </fieldset>
  );
});
