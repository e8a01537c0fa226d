'use client';

import { memo } from 'react';
import { PART_ORDER, PARTS, partRole } from '@/lib/catalog/compensators';
import { E_SERIES_NAMES, type Amplifier, type CompensatorType, type ESeriesName, type PartsOptions, type PartsResult, type Topology } from '@/lib/engine/types';
import { formatSi } from '@/lib/units/si';
import type { PartKey } from './handles';
import { parseSiField, toSiText } from './si-schema';
import { ValueCell } from './value-cell';

/** Rows in the catalogue's order, with its names, units and roles (around the given amplifier). */
const rowsFor = (type: CompensatorType, amplifier: Amplifier) =>
  PART_ORDER.map((key) => ({ key, name: PARTS[key].name, unit: PARTS[key].unit, role: partRole(type, key, amplifier) }));

function SeriesSelect({ id, label, value, disabled, onChange }: { id: string; label: string; value: ESeriesName; disabled: boolean; onChange: (s: ESeriesName) => void }) {
  return (
    <label className="inline-flex items-center gap-1.5 text-xs text-slate-600" htmlFor={id}>
      {label}
      <select id={id} className="input w-20 py-1 text-xs" value={value} disabled={disabled} onChange={(e) => onChange(e.target.value as ESeriesName)}>
        {E_SERIES_NAMES.map((s) => (
          <option key={s} value={s}>
            {s}
          </option>
        ))}
      </select>
    </label>
  );
}

/**
 * Compensator parts both ways: each value can be typed (SI prefixes; the poles and zeros
 * follow), one part is locked (it keeps its value while the handles move the others), and the
 * standard value each snaps to in the chosen series.
 */
export const PartsTable = memo(function PartsTable({
  parts,
  type,
  topology,
  amplifier = 'opamp',
  readOnly,
  lock,
  onSeriesChange,
  onPartChange,
  onLockChange,
}: {
  parts: PartsResult;
  type: CompensatorType;
  topology: Topology;
  /** The error amplifier; a transconductance stage gives the parts other roles. */
  amplifier?: Amplifier;
  readOnly: boolean;
  /** The part that holds its value while the handles move. */
  lock: PartKey;
  onSeriesChange: (options: PartsOptions) => void;
  /** Apply a typed part value; returns the reason it cannot be used, or null. */
  onPartChange: (part: PartKey, value: number) => string | null;
  onLockChange: (part: PartKey) => void;
}) {
  const options: PartsOptions = { resistorSeries: parts.resistorSeries, capacitorSeries: parts.capacitorSeries };
  const rows = rowsFor(type, amplifier)
    .filter((r) => parts.ideal[r.key] !== null && !(r.key === 'c2' && parts.ideal.c2 === 0));
  return (
    <div className="space-y-2">
      <div className="flex flex-wrap gap-3">
        <SeriesSelect id="series-r" label="Resistors" value={parts.resistorSeries} disabled={readOnly} onChange={(s) => onSeriesChange({ ...options, resistorSeries: s })} />
        <SeriesSelect id="series-c" label="Capacitors" value={parts.capacitorSeries} disabled={readOnly} onChange={(s) => onSeriesChange({ ...options, capacitorSeries: s })} />
      </div>
      <table className="table-base [&_td]:px-2 [&_th]:px-2" data-testid="parts-table">
        <thead>
          <tr>
            <th>Part</th>
            <th className="text-center" title="The locked part keeps its value while the handles move the others">Lock</th>
            <th className="text-right">Value</th>
            <th className="text-right">Snapped</th>
            <th className="text-right">Δ</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => {
            const ideal = parts.ideal[r.key] as number;
            const snapped = parts.snapped[r.key] as number;
            const delta = ideal > 0 ? (snapped / ideal - 1) * 100 : 0;
            const key = r.key as PartKey;
            const editable = r.key !== 'rb';
            const lockable = editable && ideal > 0;
            return (
              <tr key={r.key} data-part={r.key}>
                <td>
                  <span className="font-medium">{r.name}</span>
                  <span className="block text-[11px] text-slate-500">{r.role}</span>
                </td>
                <td className="text-center">
                  {lockable && (
                    <input
                      type="radio"
                      name="part-lock"
                      className="h-3.5 w-3.5"
                      aria-label={`Lock ${r.name}: it keeps its value while the handles move`}
                      checked={lock === key}
                      disabled={readOnly}
                      onChange={() => onLockChange(key)}
                      data-testid={`part-${r.key}-lock`}
                    />
                  )}
                </td>
                <td className="num whitespace-nowrap text-right font-mono" data-testid={`part-${r.key}-ideal`}>
                  {editable ? (
                    <div className="flex justify-end">
                      <ValueCell
                        label={`${r.name} in ${r.unit === 'Ω' ? 'ohms' : 'farads'}`}
                        display={formatSi(ideal, r.unit, 4)}
                        editText={toSiText(ideal)}
                        disabled={readOnly}
                        width="w-24"
                        onCommit={(text) => {
                          const v = parseSiField(text, r.name, r.unit);
                          return 'error' in v ? v.error : onPartChange(key, v.value);
                        }}
                        testId={`part-${r.key}-value`}
                      />
                    </div>
                  ) : (
                    formatSi(ideal, r.unit, 4)
                  )}
                </td>
                <td className="num whitespace-nowrap text-right font-mono font-semibold" data-testid={`part-${r.key}-snapped`}>
                  {formatSi(snapped, r.unit)}
                </td>
                <td className={`num whitespace-nowrap text-right font-mono text-xs ${Math.abs(delta) > 5 ? 'text-amber-700' : 'text-slate-500'}`}>
                  {delta >= 0 ? '+' : ''}
                  {delta.toFixed(1)} %
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      <p className="text-[11px] text-slate-500">Type a value (4.7n, 22k) and the poles and zeros follow. The locked part keeps its value while you drag the handles.</p>
      {parts.ideal.rb === null || !(parts.ideal.rb > 0) ? (
        <p className="text-xs text-red-700">No lower divider resistor: Vref must be below |Vout|.</p>
      ) : null}
      {topology === 'buck-boost' && (
        <p className="text-xs text-slate-600" data-testid="rb-note">
          Buck-boost: the output is negative. Rb assumes the controller is referenced to the negative output, so it senses |Vout| across R1 + Rb. With a
          ground-referenced controller you need a level shifter or an inverting sense stage instead.
        </p>
      )}
    </div>
  );
});
