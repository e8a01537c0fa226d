/**
 * Response bodies that routes would otherwise build inline, built here so the client's fetchers
 * (lib/queries/*) type their answers from the same functions (`Jsonified<…Body>`).
 */
import type { addRemark, submitForReview } from '@/db/queries';
import type { Role } from '@/db/schema';
import type { Margins } from '@/lib/engine/types';

type SignoffEvent = ReturnType<typeof submitForReview>;

/** POST …/submit and …/decision: the new state, the event written and how many mails went out. */
export const signoffStepBody = (event: SignoffEvent, mailed: number) => ({ state: event.state, event, mailed });

/** POST …/remarks: the stored remark with its writer's name and how many mails went out. */
export const remarkBody = (row: ReturnType<typeof addRemark>, authorName: string, mailed: number) => ({ ...row, authorName, mailed });

/** POST /api/team/invitations: the same answer whether or not the address has an account. */
export const invitationSentBody = (email: string, role: Role) => ({ invited: email, role });

/** POST /api/designs/import: the new design, its first revision and whether the file's margins were reproduced. */
export const importedDesignBody = (created: { designId: number; revision: number }, name: string, resultsMatch: boolean, margins: Margins) => ({
  id: created.designId,
  revision: created.revision,
  name,
  resultsMatch,
  margins: { crossoverHz: margins.crossoverHz, phaseMarginDeg: margins.phaseMarginDeg, gainMarginDb: margins.gainMarginDb },
});

/** PATCH …/bench/:benchId: the bench data and whether its phase is now read as −T. */
export const benchShiftedBody = (id: number, phaseShifted: boolean) => ({ id, phaseShifted });

export type BenchShiftedBody = ReturnType<typeof benchShiftedBody>;
/** POST /api/session/team: the team now current and the member's role in it. */
export const teamSwitchedBody = (teamId: number, role: Role) => ({ teamId, role });

export type TeamSwitchedBody = ReturnType<typeof teamSwitchedBody>;
export type SignoffStepBody = ReturnType<typeof signoffStepBody>;
export type RemarkBody = ReturnType<typeof remarkBody>;
export type InvitationSentBody = ReturnType<typeof invitationSentBody>;
export type ImportedDesignBody = ReturnType<typeof importedDesignBody>;
