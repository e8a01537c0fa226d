import { formatSi } from '@/lib/units/si';
import type { Margins } from '@/lib/engine/types';

import { marginTone, type MarginTone as Tone } from '@/lib/catalog/margins';

const TONE: Record<Tone, string> = {
  good: 'text-emerald-700',
  caution: 'text-amber-700',
  risk: 'text-red-700',
  none: 'text-slate-400',
};

const pmTone = (pm: number | null): Tone => marginTone('phaseMarginDeg', pm);
const gmTone = (gm: number | null): Tone => marginTone('gainMarginDb', gm);

function Item({ label, value, tone = 'none', hint, testId }: { label: string; value: string; tone?: Tone; hint?: string; testId: string }) {
  return (
    <div className="min-w-0">
      <dt className="text-[11px] font-medium uppercase tracking-wide text-slate-500">{label}</dt>
      <dd className={`num font-mono text-xl font-semibold ${tone === 'none' ? 'text-slate-900' : TONE[tone]}`} data-testid={testId}>
        {value}
      </dd>
      {hint && <dd className="text-[11px] text-slate-500">{hint}</dd>}
    </div>
  );
}

/** fc, PM, GM and the phase at fsw/2 of the loop as tuned (and of the snapped parts). */
export function MarginsReadout({
  margins,
  phaseAtHalfFswDeg,
  fsw,
  snapped,
  crossoverAboveHz = null,
}: {
  margins: Margins;
  phaseAtHalfFswDeg: number | null;
  fsw: number;
  snapped: Margins | null;
  /** The sweep's end when the loop is still above 0 dB there: the crossover lies above it. */
  crossoverAboveHz?: number | null;
}) {
  const { crossoverHz: fc, phaseMarginDeg: pm, gainMarginDb: gm } = margins;
  // A true minus sign: a hyphen before a margin is easy to miss.
  const fixed = (v: number) => v.toFixed(1).replace(/^-/, '−');
  const deg = (v: number | null) => (v === null ? '—' : `${fixed(v)}°`);
  const db = (v: number | null) => (v === null ? '—' : `${fixed(v)} dB`);
  return (
    <section aria-label="Margins" className="space-y-2">
      <dl className="grid grid-cols-2 gap-x-4 gap-y-3">
        <Item
          label="Crossover fc"
          value={fc === null ? (crossoverAboveHz !== null ? `> ${formatSi(crossoverAboveHz, 'Hz')}` : 'none') : formatSi(fc, 'Hz')}
          tone={fc === null && crossoverAboveHz !== null ? 'risk' : 'none'}
          hint={fc === null ? (crossoverAboveHz !== null ? `above the sweep${crossoverAboveHz >= fsw / 2 * (1 - 1e-9) ? ' and fsw/2' : ''}` : undefined) : `fsw/${(fsw / fc).toFixed(1)}`}
          testId="readout-fc"
        />
        <Item label="Phase margin" value={deg(pm)} tone={pmTone(pm)} testId="readout-pm" />
        <Item label="Gain margin" value={gm === null ? 'none' : db(gm)} tone={gmTone(gm)} hint={margins.phaseCrossoverHz ? `at ${formatSi(margins.phaseCrossoverHz, 'Hz')}` : 'no −180° crossing above fc'} testId="readout-gm" />
        <Item label="Phase at fsw/2" value={deg(phaseAtHalfFswDeg)} hint={formatSi(fsw / 2, 'Hz')} testId="readout-phase-half-fsw" />
      </dl>
      {snapped && (
        <p className="text-xs text-slate-500" data-testid="readout-snapped">
          With the snapped parts: fc {snapped.crossoverHz === null ? 'none' : formatSi(snapped.crossoverHz, 'Hz')}, PM {deg(snapped.phaseMarginDeg)}, GM{' '}
          {snapped.gainMarginDb === null ? '—' : db(snapped.gainMarginDb)}
        </p>
      )}
    </section>
  );
}
