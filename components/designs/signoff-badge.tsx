import { Badge } from '@/components/ui/badge';
import { SIGNOFF_STATE_LABELS, SIGNOFF_STATE_TONES, type SignoffState } from '@/lib/catalog/signoff';

export function SignoffBadge({ state }: { state: SignoffState | null }) {
  if (!state) return <span className="text-xs text-slate-400">—</span>;
  return (
    <Badge tone={SIGNOFF_STATE_TONES[state]} data-state={state}>
      {SIGNOFF_STATE_LABELS[state]}
    </Badge>
  );
}
