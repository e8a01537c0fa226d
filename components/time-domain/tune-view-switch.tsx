'use client';

export type TuneView = 'loop' | 'time';

/** Tune's two views: the open loop being shaped, and the loop closed (impedance, steps, switching check). */
export function TuneViewSwitch({ view, onView }: { view: TuneView; onView: (v: TuneView) => void }) {
  const tab = (id: TuneView, label: string) => (
    <button
      type="button"
      role="tab"
      aria-selected={view === id}
      data-testid={`tune-view-${id}`}
      className={`rounded-md px-3 py-1.5 text-sm font-medium ${view === id ? 'bg-white text-indigo-700 shadow' : 'text-slate-600 hover:text-slate-900'}`}
      onClick={() => onView(id)}
    >
      {label}
    </button>
  );
  return (
    <div role="tablist" aria-label="Tune view" className="inline-flex gap-1 rounded-lg bg-slate-200 p-1">
      {tab('loop', 'Loop shaping')}
      {tab('time', 'Closed loop & step')}
    </div>
  );
}
