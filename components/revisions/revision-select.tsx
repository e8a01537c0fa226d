'use client';

import type { RevisionBriefPage } from '@/lib/queries/revisions';
import { useRevisionPage } from './use-revision-page';

const NEWER = 'newer';
const OLDER = 'older';

/**
 * A revision drop-down that lists one page of the design's revisions (100, newest first; it opens
 * on the page holding `value`). Its first and last entries page to newer or older revisions
 * without leaving the value, so a design with thousands of revisions loads a hundred at a time.
 */
export function RevisionSelect({
  designId,
  initial,
  value,
  onPick,
  label,
  testId,
}: {
  designId: number;
  initial: RevisionBriefPage;
  value: number;
  onPick: (n: number) => void;
  label: string;
  testId: string;
}) {
  const { data, newer, older, loading } = useRevisionPage(designId, initial);
  const onPage = data.revisions.some((r) => r.number === value);
  return (
    <select
      className={`input w-28 py-1 ${loading ? 'opacity-60' : ''}`}
      value={value}
      aria-label={`Revision ${label}`}
      aria-busy={loading || undefined}
      data-testid={testId}
      onChange={(e) => {
        const v = e.target.value;
        if (v === NEWER) newer?.();
        else if (v === OLDER) older?.();
        else onPick(Number(v));
      }}
    >
      {newer && <option value={NEWER}>↑ newer…</option>}
      {!onPage && <option value={value}>r{value}</option>}
      {data.revisions.map((r) => (
        <option key={r.number} value={r.number} title={r.note || undefined}>
          r{r.number}
        </option>
      ))}
      {older && <option value={OLDER}>↓ older…</option>}
    </select>
  );
}
