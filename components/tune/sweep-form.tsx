'use client';

import type { SweepOptions } from '@/lib/engine/types';
import { formatSi } from '@/lib/units/si';
import { parseSiField, toSiText } from './si-schema';
import { SWEEP_LIMITS } from './sweep-range';
import { ValueCell } from './value-cell';

interface Props {
  /** The sweep in use (the default when the revision has none). */
  sweep: SweepOptions;
  /** Whether the revision keeps its own sweep (false: the default, 10 Hz to fsw/2). */
  custom: boolean;
  fsw: number;
  readOnly: boolean;
  /** A new sweep, or undefined for the default; returns the reason it cannot be used, or null. */
  onChange: (sweep: SweepOptions | undefined) => string | null;
}

/** Sweep start, stop and points; saved with the revision. */
export function SweepForm({ sweep, custom, fsw, readOnly, onChange }: Props) {
  const check = (next: SweepOptions): string | null => {
    if (!(next.fStart >= SWEEP_LIMITS.minHz)) return `Sweep start must be at least ${formatSi(SWEEP_LIMITS.minHz, 'Hz')}`;
    if (!(next.fStop <= SWEEP_LIMITS.maxHz)) return `Sweep stop must be at most ${formatSi(SWEEP_LIMITS.maxHz, 'Hz')}`;
    if (!(next.fStop > next.fStart)) return 'Sweep stop must be above the start';
    if (!Number.isInteger(next.points) || next.points < SWEEP_LIMITS.minPoints || next.points > SWEEP_LIMITS.maxPoints)
      return `Sweep points must be a whole number from ${SWEEP_LIMITS.minPoints} to ${SWEEP_LIMITS.maxPoints}`;
    return onChange(next);
  };
  const hz = (key: 'fStart' | 'fStop', label: string) => (text: string) => {
    const r = parseSiField(text, label, 'Hz');
    return 'error' in r ? r.error : check({ ...sweep, [key]: r.value });
  };
  const points = (text: string) => {
    const v = Number(text.trim());
    return Number.isFinite(v) && text.trim() !== '' ? check({ ...sweep, points: v }) : `Sweep points: "${text}" is not a number`;
  };
  return (
    <div className="space-y-2" data-testid="sweep-form">
      <div className="grid grid-cols-3 gap-2 text-xs text-slate-600">
        <label className="block">
          Start
          <ValueCell label="Sweep start in Hz" display={formatSi(sweep.fStart, 'Hz', 4)} editText={toSiText(sweep.fStart)} disabled={readOnly} onCommit={hz('fStart', 'Sweep start')} testId="sweep-start" width="w-full" />
        </label>
        <label className="block">
          Stop
          <ValueCell label="Sweep stop in Hz" display={formatSi(sweep.fStop, 'Hz', 4)} editText={toSiText(sweep.fStop)} disabled={readOnly} onCommit={hz('fStop', 'Sweep stop')} testId="sweep-stop" width="w-full" />
        </label>
        <label className="block">
          Points
          <ValueCell label="Sweep points" display={String(sweep.points)} editText={String(sweep.points)} disabled={readOnly} onCommit={points} testId="sweep-points" width="w-full" />
        </label>
      </div>
      <p className="text-[11px] text-slate-500" data-testid="sweep-source">
        {custom ? (
          <>
            Saved with the revision.{' '}
            {!readOnly && (
              <button type="button" className="text-indigo-700 underline" onClick={() => onChange(undefined)} data-testid="sweep-default">
                Back to the default (10 Hz – fsw/2 = {formatSi(fsw / 2, 'Hz')})
              </button>
            )}
          </>
        ) : (
          <>Default: 10 Hz to fsw/2, 400 points. A sweep set here is saved with the revision.</>
        )}
      </p>
    </div>
  );
}
