import Link from 'next/link';

export type DesignListView = 'active' | 'waiting' | 'archived';

/** The three views of the designs list; each is a server-side filter in the URL (?waiting=me, ?archived=archived). */
export function DesignListFilterTabs({ view, waitingCount, showWaiting }: { view: DesignListView; waitingCount: number; showWaiting: boolean }) {
  const tabs: { view: DesignListView; label: string; href: string }[] = [
    { view: 'active', label: 'Active designs', href: '/designs' },
    ...(showWaiting ? [{ view: 'waiting' as const, label: `Waiting for my review (${waitingCount})`, href: '/designs?waiting=me' }] : []),
    { view: 'archived', label: 'Archived', href: '/designs?archived=archived' },
  ];
  return (
    <nav className="flex flex-wrap gap-1 rounded-lg bg-slate-200 p-1 text-sm" aria-label="Which designs" data-testid="designs-view">
      {tabs.map((t) => (
        <Link
          key={t.view}
          href={t.href}
          aria-current={t.view === view ? 'page' : undefined}
          className={`rounded-md px-3 py-1 ${t.view === view ? 'bg-white font-medium text-indigo-700 shadow-sm' : 'text-slate-600 hover:text-slate-900'} ${t.view === 'waiting' && waitingCount > 0 && t.view !== view ? 'font-semibold text-indigo-800' : ''}`}
        >
          {t.label}
        </Link>
      ))}
    </nav>
  );
}
