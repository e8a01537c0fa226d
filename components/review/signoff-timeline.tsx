import { formatDateTime } from '@/lib/format';

export interface TimelineItem {
  kind: 'event' | 'remark';
  id: number;
  at: string;
  who: string;
  state?: string;
  reviewerName?: string | null;
  text: string;
}

const EVENT_WORDS: Record<string, string> = {
  'in-review': 'submitted for review',
  approved: 'approved',
  'changes-requested': 'requested changes',
};

/** A revision's sign-off steps and remarks, oldest first. */
export function SignoffTimeline({ items }: { items: TimelineItem[] }) {
  return (
    <ol className="space-y-2" data-testid="timeline">
      {items.length === 0 && <li className="text-sm text-slate-500">Nothing yet.</li>}
      {items.map((t) => (
        <li key={`${t.kind}-${t.id}`} className={`rounded-md px-3 py-2 text-sm ${t.kind === 'event' ? 'border-l-2 border-indigo-300 bg-slate-50' : 'border border-slate-200'}`}>
          <div className="flex flex-wrap items-baseline gap-x-2 text-xs text-slate-500">
            <span className="font-medium text-slate-800">{t.who}</span>
            {t.kind === 'event' ? (
              <span>
                {EVENT_WORDS[t.state ?? ''] ?? t.state}
                {t.reviewerName ? ` · reviewer ${t.reviewerName}` : ''}
              </span>
            ) : (
              <span>remarked</span>
            )}
            <span className="num ml-auto">{formatDateTime(t.at)}</span>
          </div>
          {t.text && <p className="mt-1 whitespace-pre-wrap text-slate-800">{t.text}</p>}
        </li>
      ))}
    </ol>
  );
}
