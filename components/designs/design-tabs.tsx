'use client';

import Link from 'next/link';
import { usePathname } from 'next/navigation';

const TABS = [
  { slug: '', label: 'Tune' },
  { slug: '/history', label: 'History' },
  { slug: '/compare', label: 'Compare' },
  { slug: '/handoff', label: 'Handoff' },
];

export function DesignTabs({ designId }: { designId: number }) {
  const pathname = usePathname();
  const base = `/designs/${designId}`;
  return (
    <nav className="ml-auto flex gap-1 rounded-lg bg-slate-200 p-1 text-sm" aria-label="Design sections">
      {TABS.map((t) => {
        const href = base + t.slug;
        const active = t.slug === '' ? pathname === base : pathname.startsWith(href);
        return (
          <Link
            key={t.label}
            href={href}
            aria-current={active ? 'page' : undefined}
            className={`rounded-md px-3 py-1 ${active ? 'bg-white font-medium text-indigo-700 shadow-sm' : 'text-slate-600 hover:text-slate-900'}`}
          >
            {t.label}
          </Link>
        );
      })}
    </nav>
  );
}
