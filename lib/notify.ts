import 'server-only';
import { appBaseUrl, sendMail } from './mail';

/**
 * Team notifications by e-mail: review requested, approved, changes
 * requested, added to a team. Each links to the revision (or the app).
 */

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
