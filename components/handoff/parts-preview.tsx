import { formatSi } from '@/lib/units/si';
import { formatTolerance, PART_NAME, type PartRow } from '@/lib/handoff/parts-list';

export function PartsPreview({ rows, duplicates }: { rows: PartRow[]; duplicates: string[] }) {
  return (
    <div className="overflow-x-auto">
      {duplicates.length > 0 && (
        <p className="mb-2 rounded border border-rose-300 bg-rose-50 px-3 py-1.5 text-sm text-rose-800" role="alert">
          Designator used twice: {duplicates.join(', ')}. Give each part its own before exporting.
        </p>
      )}
      <table className="table-base" data-testid="parts-preview">
        <thead>
          <tr>
            <th>Designator</th>
            <th>Role</th>
            <th className="text-right">Ideal</th>
            <th className="text-right">Standard</th>
            <th>Series</th>
            <th>Tolerance</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => {
            const unit = r.kind === 'resistor' ? 'Ω' : 'F';
            return (
              <tr key={r.part}>
                <td className="font-mono font-semibold">
                  {r.designator}
                  {r.designator !== PART_NAME[r.part] && <span className="ml-1 text-xs font-normal text-slate-400">({PART_NAME[r.part]})</span>}
                </td>
                <td className="text-slate-700">{r.role.replace(/^\S+ — /, '')}</td>
                <td className="num whitespace-nowrap text-right text-slate-500">{formatSi(r.ideal, unit, 4)}</td>
                <td className="num whitespace-nowrap text-right font-semibold">{formatSi(r.standard, unit)}</td>
                <td>{r.series}</td>
                <td className="whitespace-nowrap">{formatTolerance(r.tolerancePct)}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
