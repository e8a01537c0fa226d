import Link from 'next/link';
import { formatCount } from '@/lib/format';

/**
 * "Newer · page x of y · Older" for a server-paged list; the page lives in the URL (`href`
 * builds it), so Back and a shared link return to the same page. Inside a client component
 * `onPage` may replace `href` (buttons; the caller keeps the page in the URL itself).
 * Renders nothing for one page.
 */
export function Pager({
  page,
  lastPage,
  total,
  noun,
  href,
  onPage,
  testId,
}: {
  page: number;
  lastPage: number;
  total: number;
  noun: string;
  href?: (page: number) => string;
  onPage?: (page: number) => void;
  testId?: string;
}) {
  if (lastPage <= 1) return null;
  const link = 'rounded px-2 py-1 text-indigo-700 hover:bg-indigo-50 hover:underline';
  const off = 'rounded px-2 py-1 text-slate-400';
  const step = (to: number, text: string, rel: 'prev' | 'next') =>
    href ? (
      <Link href={href(to)} className={link} rel={rel} scroll={false}>
        {text}
      </Link>
    ) : (
      <button type="button" className={link} onClick={() => onPage?.(to)}>
        {text}
      </button>
    );
  return (
    <nav className="flex items-center justify-end gap-2 px-3 py-2 text-sm" aria-label={`Pages of ${noun}`} data-testid={testId}>
      {page > 1 ? step(page - 1, '← Newer', 'prev') : <span className={off}>← Newer</span>}
      <span className="num text-slate-600">
        Page {page} of {lastPage} · {formatCount(total)} {noun}
      </span>
      {page < lastPage ? step(page + 1, 'Older →', 'next') : <span className={off}>Older →</span>}
    </nav>
  );
}
