'use client';

import { useState } from 'react';
import { compensatorFor, compensatorTitle } from '@/lib/catalog/compensators';
import { COMPENSATOR_TYPES, type CompensatorShape, type CompensatorType } from '@/lib/engine/types';
import { formatSi } from '@/lib/units/si';
import type { HandleMove } from './handle-overlay';
import { moveFrequency, setGainAt, type HandleSpec } from './handles';
import { parseSiField, toSiText } from './si-schema';
import { ValueCell } from './value-cell';


const GLYPH: Record<HandleSpec['kind'], string> = { zero: '○', pole: '✕', gain: '◆' };

const STEP_DECADE = 1 / 48;
const STEP_DECADE_BIG = 1 / 8;

interface Props {
  shape: CompensatorShape;
  handles: HandleSpec[];
  readOnly: boolean;
  /** Apply a new shape; returns the reason it cannot be built, or null. */
  onShape: (shape: CompensatorShape) => string | null;
  onStep: (id: string, move: HandleMove) => void;
  onTypeChange: (type: CompensatorType) => string | null;
}

/** The handles as numbers: type, gain, each zero and pole, and R1, editable by keyboard. */
export function CompensatorTable({ shape, handles, readOnly, onShape, onStep, onTypeChange }: Props) {
  const [typeError, setTypeError] = useState<string | null>(null);
  const entry = compensatorFor(shape.type, shape.fixed?.amplifier);
  const hzStep = (id: string, hz: number) => (sign: 1 | -1, big: boolean) => onStep(id, { hz: hz * 10 ** (sign * (big ? STEP_DECADE_BIG : STEP_DECADE)) });

  const setHz = (h: HandleSpec) => (text: string) => {
    const r = parseSiField(text, `${h.label} frequency`, 'Hz');
    if ('error' in r) return r.error;
    return onShape(moveFrequency(shape, h.id, r.value));
  };

  const setGainDb = (h: HandleSpec) => (text: string) => {
    const v = Number(text.replace(/\s*dB$/i, '').replace('−', '-'));
    if (!Number.isFinite(v) || text.trim() === '') return `${h.label}: "${text}" is not a number of dB`;
    const next = setGainAt(shape, h.hz, v);
    return next ? onShape(next) : 'the compensator cannot be built as it is; fix its poles and zeros first';
  };

  const setIntegrator = (text: string) => {
    const r = parseSiField(text, 'Integrator 0 dB frequency', 'Hz');
    return 'error' in r ? r.error : onShape({ ...shape, integratorHz: r.value });
  };

  const setR1 = (text: string) => {
    const r = parseSiField(text, 'R1', 'Ω');
    return 'error' in r ? r.error : onShape({ ...shape, r1: r.value });
  };

  return (
    <div className="space-y-3">
      <label className="block">
        <span className="label">Compensator</span>
        <select
          className="input"
          value={shape.type}
          disabled={readOnly}
          data-testid="compensator-type"
          onChange={(e) => setTypeError(onTypeChange(e.target.value as CompensatorType))}
        >
          {COMPENSATOR_TYPES.map((t) => (
            <option key={t} value={t}>
              {compensatorTitle(t)}
            </option>
          ))}
        </select>
        {typeError && (
          <p className="mt-1 text-xs text-amber-800" role="status" data-testid="type-note">
            {typeError}
          </p>
        )}
      </label>
      <table className="table-base [&_td]:px-2 [&_th]:px-2" data-testid="handle-table">
        <thead>
          <tr>
            <th>Handle</th>
            <th>Sets</th>
            <th className="text-right">Value</th>
          </tr>
        </thead>
        <tbody>
          {handles.map((h) => (
            <tr key={h.id} data-row={h.id}>
              <td className="whitespace-nowrap">
                <span className="mr-1.5 inline-block w-4 text-center font-semibold text-amber-600" aria-hidden>
                  {GLYPH[h.kind]}
                </span>
                {h.label}
              </td>
              <td className="text-xs text-slate-500">{h.kind === 'gain' ? `|Gc| here; sets ${h.parts}` : h.parts}</td>
              <td className="flex justify-end">
                {h.kind === 'gain' ? (
                  <ValueCell
                    label={`Compensator gain at ${formatSi(h.hz, 'Hz')} in dB`}
                    display={h.gainDb == null ? '—' : `${h.gainDb.toFixed(2)} dB`}
                    editText={h.gainDb == null ? '' : h.gainDb.toFixed(2)}
                    disabled={readOnly}
                    onCommit={setGainDb(h)}
                    onStep={(sign, big) => onStep('gain', { deltaDb: sign * (big ? 3 : 0.5) })}
                    testId="value-gain"
                  />
                ) : (
                  <ValueCell
                    label={`${h.label} frequency in Hz`}
                    display={formatSi(h.hz, 'Hz', 4)}
                    editText={toSiText(h.hz)}
                    disabled={readOnly}
                    onCommit={setHz(h)}
                    onStep={hzStep(h.id, h.hz)}
                    testId={`value-${h.id}`}
                  />
                )}
              </td>
            </tr>
          ))}
          <tr data-row="integrator">
            <td>
              <span className="mr-1.5 inline-block w-4" aria-hidden />
              Integrator 0 dB
            </td>
            <td className="text-xs text-slate-500" data-testid="integrator-formula">{entry.integrator}: the low-frequency gain; the ◆ handle moves it</td>
            <td className="flex justify-end">
              <ValueCell
                label="Integrator 0 dB frequency in Hz"
                display={formatSi(shape.integratorHz, 'Hz', 4)}
                editText={toSiText(shape.integratorHz)}
                disabled={readOnly}
                onCommit={setIntegrator}
                testId="value-integrator"
              />
            </td>
          </tr>
          <tr data-row="r1">
            <td>
              <span className="mr-1.5 inline-block w-4" aria-hidden />
              R1
            </td>
            <td className="text-xs text-slate-500">{entry.r1Note}</td>
            <td className="flex justify-end">
              <ValueCell label="R1 in ohms" display={formatSi(shape.r1, 'Ω', 4)} editText={toSiText(shape.r1)} disabled={readOnly} onCommit={setR1} testId="value-r1" />
            </td>
          </tr>
        </tbody>
      </table>
    </div>
  );
}
