import type { ReactNode } from 'react';
import type { BadgeTone } from '@/lib/catalog/signoff';

const TONES: Record<BadgeTone, string> = {
  neutral: 'bg-slate-100 text-slate-700',
  info: 'bg-sky-100 text-sky-800',
  good: 'bg-emerald-100 text-emerald-800',
  caution: 'bg-amber-100 text-amber-800',
  attention: 'bg-rose-100 text-rose-800',
};

/** A small rounded label: sign-off states, roles, counts. */
export function Badge({ tone = 'neutral', children, ...data }: { tone?: BadgeTone; children: ReactNode } & { [k: `data-${string}`]: string }) {
  return (
    <span className={`inline-block rounded-full px-2 py-0.5 text-xs font-medium ${TONES[tone]}`} {...data}>
      {children}
    </span>
  );
}
