import 'server-only';
import type { Db } from '@/db/connection';
import { getUserById } from '@/db/queries';
import { appBaseUrl, sendMail } from './mail';

/**
 * Team notifications by e-mail: review requested, approved, changes
 * requested, added to a team. Each links to the revision (or the app).
 */

/**
 * Mail each of the given users (those that still exist) and count the messages sent; the
 * route answers with the count so the client can say who was told.
 */
export async function mailEach(db: Db, userIds: number[], send: (to: { email: string; name: string }) => Promise<{ sent: boolean }>): Promise<number> {
  const users = userIds.map((id) => getUserById(db, id)).filter((u) => u !== undefined);
  const results = await Promise.all(users.map((u) => send({ email: u.email, name: u.name })));
  return results.filter((r) => r.sent).length;
}

export interface RevisionMailRef {
  designId: number;
  designName: string;
  number: number;
}

/** Where a mail points for one revision: its row on the History tab. */
export async function revisionUrl(r: { designId: number; number: number }) {
  return `${await appBaseUrl()}/designs/${r.designId}/history?r=${r.number}`;
}

const label = (r: RevisionMailRef) => `${r.designName} r${r.number}`;

export async function notifyReviewRequested(m: {
  to: { email: string; name: string };
  by: string;
  teamId: number;
  revision: RevisionMailRef;
  message: string;
  /** The worst case across the operating range, one sentence. */
  worstCase?: string;
}) {
  return sendMail({
    to: m.to.email,
    teamId: m.teamId,
    subject: `Review requested: ${label(m.revision)}`,
    paragraphs: [`Hello ${m.to.name},`, `${m.by} asks you to review ${label(m.revision)} and sign it off.`, ...(m.worstCase ? [m.worstCase] : [])],
    quote: m.message || undefined,
    link: { label: `Open r${m.revision.number}`, url: await revisionUrl(m.revision) },
  });
}

export async function notifyDecision(m: {
  to: { email: string; name: string };
  by: string;
  teamId: number;
  revision: RevisionMailRef;
  decision: 'approve' | 'request-changes';
  message: string;
}) {
  const approved = m.decision === 'approve';
  return sendMail({
    to: m.to.email,
    teamId: m.teamId,
    subject: `${approved ? 'Approved' : 'Changes requested'}: ${label(m.revision)}`,
    paragraphs: [
      `Hello ${m.to.name},`,
      approved
        ? `${m.by} approved ${label(m.revision)}.`
        : `${m.by} requested changes to ${label(m.revision)}. Save a new revision with the changes and submit it again.`,
    ],
    quote: m.message || undefined,
    link: { label: `Open r${m.revision.number}`, url: await revisionUrl(m.revision) },
  });
}

export async function notifyAddedToTeam(m: { to: string; name: string; teamId: number; teamName: string; role: string; by: string }) {
  return sendMail({
    to: m.to,
    teamId: m.teamId,
    subject: `You were added to ${m.teamName} on Phasewright`,
    paragraphs: [`Hello ${m.name},`, `${m.by} added you to the team ${m.teamName} as ${m.role}.`],
    link: { label: 'Open Phasewright', url: `${await appBaseUrl()}/designs` },
  });
}

/** An invitation to a team; the link accepts it (sign in, or create the account). */
export async function notifyInvitation(m: { to: string; teamId: number; teamName: string; role: string; by: string; token: string }) {
  return sendMail({
    to: m.to,
    teamId: m.teamId,
    subject: `Invitation to ${m.teamName} on Phasewright`,
    paragraphs: [`Hello,`, `${m.by} invites you to the team ${m.teamName} as ${m.role}. The link is valid for 7 days.`],
    link: { label: 'Accept the invitation', url: `${await appBaseUrl()}/invitations/accept?token=${encodeURIComponent(m.token)}` },
  });
}

/** A remark on a revision (on its own or written on Compare), to its author and its reviewer. */
export async function notifyRemark(m: {
  to: { email: string; name: string };
  by: string;
  teamId: number;
  revision: RevisionMailRef;
  comparedWith: number | null;
  body: string;
}) {
  const where = m.comparedWith ? ` while comparing it with r${m.comparedWith}` : '';
  const base = await appBaseUrl();
  const url = m.comparedWith
    ? `${base}/designs/${m.revision.designId}/compare?a=${m.comparedWith}&b=${m.revision.number}`
    : await revisionUrl(m.revision);
  return sendMail({
    to: m.to.email,
    teamId: m.teamId,
    subject: `Remark on ${label(m.revision)}`,
    paragraphs: [`Hello ${m.to.name},`, `${m.by} left a remark on ${label(m.revision)}${where}.`],
    quote: m.body,
    link: { label: m.comparedWith ? `Open the comparison r${m.comparedWith} → r${m.revision.number}` : `Open r${m.revision.number}`, url },
  });
}
