import type { Check, CheckLevel } from '@/lib/engine/types';

const LEVELS: Record<CheckLevel, { label: string; badge: string; order: number }> = {
  risk: { label: 'Risk', badge: 'bg-red-100 text-red-800 ring-red-200', order: 0 },
  caution: { label: 'Caution', badge: 'bg-amber-100 text-amber-900 ring-amber-200', order: 1 },
  note: { label: 'Note', badge: 'bg-slate-100 text-slate-700 ring-slate-200', order: 2 },
};

/** The design's Checks, worst first. */
export function ChecksList({ checks }: { checks: Check[] }) {
  const sorted = [...checks].sort((a, b) => LEVELS[a.level].order - LEVELS[b.level].order);
  if (sorted.length === 0)
    return (
      <p className="text-sm text-emerald-700" data-testid="checks-empty">
        No checks raised at this operating point.
      </p>
    );
  return (
    <ul className="space-y-2" data-testid="checks">
      {sorted.map((c) => (
        <li key={`${c.id}-${c.level}`} className="flex gap-2 text-sm" data-check={c.id} data-level={c.level}>
          <span className={`mt-0.5 h-fit shrink-0 rounded px-1.5 py-0.5 text-[11px] font-semibold uppercase ring-1 ring-inset ${LEVELS[c.level].badge}`}>
            {LEVELS[c.level].label}
          </span>
          <span className="text-slate-700">{c.message}</span>
        </li>
      ))}
    </ul>
  );
}
