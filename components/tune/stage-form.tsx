'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { memo, useEffect, useMemo, useRef } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { inputApplies, inputLabel, inputPath, readInput, STAGE_INPUTS, writeInput, type InputSpec, type Stage } from '@/lib/catalog/stage-inputs';
import type { FieldIssue } from '@/lib/engine/types';
import { siText, toSiText } from './si-schema';
import { TextField } from './text-field';

type StageField = string;

/** The inputs this stage's modes use, from the catalogue. */
const fieldsFor = (stage: Stage): InputSpec[] => STAGE_INPUTS.filter((spec) => inputApplies(spec, stage));

const schemaFor = (fields: readonly InputSpec[]) =>
  z.object(Object.fromEntries(fields.map((f) => [f.field, siText(inputLabel(f), f.unit, f.bound)])));

type StageText = Record<StageField, string>;
type StageValues = Record<StageField, number>;

const numbersOf = (s: Stage, fields: readonly InputSpec[]): StageValues =>
  Object.fromEntries(fields.map((f) => [f.field, readInput(s, f) ?? 0]));

const toText = (s: Stage, fields: readonly InputSpec[]): StageText => {
  const n = numbersOf(s, fields);
  return Object.fromEntries(fields.map((f) => [f.field, f.plain ? String(Number(n[f.field].toPrecision(6))) : toSiText(n[f.field], 6)]));
};

const fromValues = (v: StageValues, base: Stage, fields: readonly InputSpec[]): Stage =>
  fields.reduce((stage, f) => writeInput(stage, f, v[f.field]), base);

/** Fields whose text was not touched keep their exact starting value (the text may round it). */
const keepUntouched = (parsed: StageValues, text: Partial<StageText>, start: StageText, startValues: StageValues, fields: readonly InputSpec[]): StageValues =>
  Object.fromEntries(fields.map((f) => [f.field, text[f.field] === start[f.field] ? startValues[f.field] : parsed[f.field]]));

export interface StageFormProps {
  value: Stage;
  readOnly: boolean;
  /** Physical problems the engine found, by path ("converter.vout"), shown under their fields. */
  issues: FieldIssue[];
  onChange: (stage: Stage) => void;
  /** False while a field holds text that does not parse (the draft keeps its last good value). */
  onValidityChange: (valid: boolean) => void;
}

/** Power stage, modulator and reference inputs; SI-prefix text, checked as typed. */
export const StageForm = memo(function StageForm({ value, readOnly, issues, onChange, onValidityChange }: StageFormProps) {
  const fields = useMemo(() => fieldsFor(value), [value]);
  const schema = useMemo(() => schemaFor(fields), [fields]);
  const start = useRef({ text: toText(value, fields), values: numbersOf(value, fields) });
  const {
    register,
    watch,
    formState: { errors },
  } = useForm<StageText, unknown, StageValues>({
    resolver: zodResolver(schema),
    mode: 'onChange',
    defaultValues: start.current.text,
  });
  const latest = useRef({ onChange, onValidityChange, value, fields, schema });
  latest.current = { onChange, onValidityChange, value, fields, schema };

  useEffect(() => {
    const sub = watch((text) => {
      const { fields, schema, value } = latest.current;
      const r = schema.safeParse(text);
      latest.current.onValidityChange(r.success);
      if (r.success) latest.current.onChange(fromValues(keepUntouched(r.data, text, start.current.text, start.current.values, fields), value, fields));
    });
    return () => sub.unsubscribe();
  }, [watch]);

  return (
    <fieldset className="grid grid-cols-2 gap-x-3 gap-y-2" disabled={readOnly} aria-label="Power stage">
      {fields.map((f) => {
        const engineError = issues.find((i) => i.path === inputPath(f))?.message;
        return (
          <TextField
            key={f.field}
            id={`stage-${f.field}`}
            label={inputLabel(f)}
            unit={f.unit}
            error={errors[f.field]?.message ?? engineError}
            placeholder={f.zeroMeans ? `0 = ${f.zeroMeans}` : undefined}
            title={f.help}
            {...register(f.field)}
          />
        );
      })}
    </fieldset>
  );
});
