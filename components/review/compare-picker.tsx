'use client';

import { useRouter } from 'next/navigation';

/** Choose the two revisions to compare; A is drawn dashed, B solid. */
export function ComparePicker({ designId, numbers, a, b }: { designId: number; numbers: number[]; a: number; b: number }) {
  const router = useRouter();
  const go = (na: number, nb: number) => router.push(`/designs/${designId}/compare?a=${na}&b=${nb}`);
  const select = (label: string, value: number, onChange: (n: number) => void, testId: string) => (
    <label className="flex items-center gap-2 text-sm">
      <span className="font-medium text-slate-600">{label}</span>
      <select className="input w-24 py-1" value={value} onChange={(e) => onChange(Number(e.target.value))} data-testid={testId} aria-label={`Revision ${label}`}>
        {numbers.map((n) => (
          <option key={n} value={n}>
            r{n}
          </option>
        ))}
      </select>
    </label>
  );
  return (
    <div className="flex flex-wrap items-center gap-3">
      {select('A', a, (n) => go(n, b), 'compare-a')}
      <button type="button" className="btn-secondary px-2 py-1" onClick={() => go(b, a)} title="Swap A and B" aria-label="Swap A and B">
        ⇄
      </button>
      {select('B', b, (n) => go(a, n), 'compare-b')}
    </div>
  );
}
