import { CAUTIONS } from '@/lib/cautions';

/** Compact caution strip for work screens; `full` shows every paragraph. */
export function CautionsPanel({ full = false }: { full?: boolean }) {
  if (full)
    return (
      <div className="space-y-4">
        {CAUTIONS.map((c) => (
          <section key={c.id} className="card border-l-4 border-l-amber-500 p-4">
            <h2 className="font-semibold">{c.title}</h2>
            <p className="mt-1 text-sm text-slate-700">{c.text}</p>
          </section>
        ))}
      </div>
    );
  return (
    <aside
      className="rounded-md border border-amber-300 bg-amber-50 px-3 py-2 text-xs text-amber-900"
      aria-label="Cautions"
      data-testid="cautions"
    >
      <strong className="font-semibold">⚠ Cautions:</strong> hazardous voltages and stored energy — the small-signal model is an
      estimate at one operating point (CCM, no large-signal effects) — verify the loop on the bench — follow local codes and licensed
      practice.{' '}
      <a href="/cautions" className="underline">
        Read the limits
      </a>
    </aside>
  );
}
