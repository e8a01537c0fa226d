const STYLES: Record<string, string> = {
  draft: 'bg-slate-100 text-slate-700',
  'in-review': 'bg-sky-100 text-sky-800',
  approved: 'bg-emerald-100 text-emerald-800',
  'changes-requested': 'bg-rose-100 text-rose-800',
};

const LABELS: Record<string, string> = {
  draft: 'Draft',
  'in-review': 'In review',
  approved: 'Approved',
  'changes-requested': 'Changes requested',
};

export function SignoffBadge({ state }: { state: string | null }) {
  if (!state) return <span className="text-xs text-slate-400">—</span>;
  return (
    <span className={`inline-block rounded-full px-2 py-0.5 text-xs font-medium ${STYLES[state] ?? STYLES.draft}`} data-state={state}>
      {LABELS[state] ?? state}
    </span>
  );
}
