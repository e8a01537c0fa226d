'use client';

import type { MarginTargets, OperatingRange } from '@/lib/engine/range';
import { CornerTable } from './corner-table';
import { Card } from '@/components/ui/card';
import type { CornerView } from './corner-traces';
import { RangeForm } from './range-form';
import { SpreadPanel, type SpreadRequest } from './spread-panel';
import type { CornersState } from './use-corners';
import type { SpreadState } from './use-spread';

/** The corner view toggle shown above the Bode plot. */
export function CornerViewToggle({ view, onChange, count }: { view: CornerView; onChange: (v: CornerView) => void; count: number }) {
  return (
    <span className="inline-flex items-center gap-1.5 text-sm" role="group" aria-label="Corners on the plot">
      <span className="text-slate-600">Corners ({count}):</span>
      {(['off', 'band', 'family'] as const).map((v) => (
        <label key={v} className="inline-flex cursor-pointer items-center gap-1">
          <input type="radio" name="corner-view" value={v} checked={view === v} onChange={() => onChange(v)} data-testid={`corners-${v}`} />
          {v === 'off' ? 'off' : v === 'band' ? 'band' : 'curves'}
        </label>
      ))}
    </span>
  );
}

/** Operating range form, corner table and tolerance spread: the Tune screen's "across the range" row. */
export function RangePanel({
  range,
  targets,
  seriesTol,
  readOnly,
  corners,
  spread,
  stale,
  onChange,
  onRun,
  onCancel,
}: {
  range: OperatingRange;
  targets: MarginTargets;
  seriesTol: { resistorTol: number; capacitorTol: number };
  readOnly: boolean;
  corners: CornersState;
  spread: SpreadState;
  stale: boolean;
  onChange: (next: { range: OperatingRange; targets: MarginTargets }) => void;
  onRun: (r: SpreadRequest) => void;
  onCancel: () => void;
}) {
  const issues = corners && !corners.ok ? corners.issues : [];
  return (
    <div className="grid items-start gap-4 xl:grid-cols-[22rem_minmax(0,1fr)]" data-testid="range-panel">
      <Card title="Operating range" aside={<span className="text-xs text-slate-500">saved with the revision</span>}>
        <RangeForm range={range} targets={targets} seriesTol={seriesTol} readOnly={readOnly} issues={issues} onChange={onChange} />
        {issues.length > 0 && (
          <ul className="mt-2 space-y-0.5 text-xs text-red-700" role="alert">
            {issues.map((i) => (
              <li key={i.path + i.message}>{i.message}</li>
            ))}
          </ul>
        )}
      </Card>
      <div className="space-y-4">
        <Card
          title="Corners"
          aside={corners?.ok && <span className="text-xs text-slate-500">{corners.value.corners.length} corners, compensator at nominal; worst PM row in red</span>}
        >
          {corners?.ok ? <CornerTable result={corners.value} targets={targets} /> : <p className="text-sm text-slate-500">{corners ? 'Fix the range to see the corners.' : 'Working out the corners…'}</p>}
        </Card>
        <Card title="Tolerance spread" aside={<span className="text-xs text-slate-500">every part within its tolerance, at nominal line and load</span>}>
          <SpreadPanel state={spread} stale={stale} targets={targets} onRun={onRun} onCancel={onCancel} />
        </Card>
      </div>
    </div>
  );
}
