'use client';

import { useRouter } from 'next/navigation';
import type { RevisionBriefPage } from '@/lib/queries/revisions';
import { RevisionSelect } from '@/components/revisions/revision-select';

/**
 * Choose the two revisions to compare; A is drawn dashed, B solid. Each list holds one page of
 * revisions (the one holding its choice) and pages through the rest on demand.
 */
export function ComparePicker({ designId, a, b, pageA, pageB }: { designId: number; a: number; b: number; pageA: RevisionBriefPage; pageB: RevisionBriefPage }) {
  const router = useRouter();
  const go = (na: number, nb: number) => router.push(`/designs/${designId}/compare?a=${na}&b=${nb}`);
  return (
    <div className="flex flex-wrap items-center gap-3">
      <label className="flex items-center gap-2 text-sm">
        <span className="font-medium text-slate-600">A</span>
        <RevisionSelect key={`a${a}`} designId={designId} initial={pageA} value={a} onPick={(n) => go(n, b)} label="A" testId="compare-a" />
      </label>
      <button type="button" className="btn-secondary px-2 py-1" onClick={() => go(b, a)} title="Swap A and B" aria-label="Swap A and B">
        ⇄
      </button>
      <label className="flex items-center gap-2 text-sm">
        <span className="font-medium text-slate-600">B</span>
        <RevisionSelect key={`b${b}`} designId={designId} initial={pageB} value={b} onPick={(n) => go(a, n)} label="B" testId="compare-b" />
      </label>
    </div>
  );
}
