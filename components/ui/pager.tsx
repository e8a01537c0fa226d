import Link from 'next/link';
import { formatCount } from '@/lib/format';

/**
 * "Newer · page x of y · Older" links for a server-paged list; the page lives in the URL (`href`
 * builds it), so Back and a shared link return to the same page. Renders nothing for one page.
 */
export function Pager({ page, lastPage, total, noun, href, testId }: { page: number; lastPage: number; total: number; noun: string; href: (page: number) => string; testId?: string }) {
  if (lastPage <= 1) return null;
  const link = 'rounded px-2 py-1 text-indigo-700 hover:bg-indigo-50 hover:underline';
  const off = 'rounded px-2 py-1 text-slate-400';
  return (
    <nav className="flex items-center justify-end gap-2 px-3 py-2 text-sm" aria-label={`Pages of ${noun}`} data-testid={testId}>
      {page > 1 ? (
        <Link href={href(page - 1)} className={link} rel="prev" scroll={false}>
          ← Newer
        </Link>
      ) : (
        <span className={off}>← Newer</span>
      )}
      <span className="num text-slate-600">
        Page {page} of {lastPage} · {formatCount(total)} {noun}
      </span>
      {page < lastPage ? (
        <Link href={href(page + 1)} className={link} rel="next" scroll={false}>
          Older →
        </Link>
      ) : (
        <span className={off}>Older →</span>
      )}
    </nav>
  );
}

