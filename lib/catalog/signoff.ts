/**
 * Sign-off states of a revision and how every screen, mail and export names
 * them. The database enum (db/schema.ts) is built from SIGNOFF_STATES.
 */
/** Tones a badge can take (components/ui/badge.tsx). */
export type BadgeTone = 'neutral' | 'info' | 'good' | 'caution' | 'attention';

export const SIGNOFF_STATES = ['draft', 'in-review', 'approved', 'changes-requested'] as const;
export type SignoffState = (typeof SIGNOFF_STATES)[number];

export const SIGNOFF_STATE_LABELS = {
  draft: 'Draft',
  'in-review': 'In review',
  approved: 'Approved',
  'changes-requested': 'Changes requested',
} as const satisfies Record<SignoffState, string>;

/** Badge tone per state (components/ui/badge). */
export const SIGNOFF_STATE_TONES = {
  draft: 'neutral',
  'in-review': 'info',
  approved: 'good',
  'changes-requested': 'attention',
} as const satisfies Record<SignoffState, BadgeTone>;

export const signoffLabel = (state: SignoffState): string => SIGNOFF_STATE_LABELS[state];
