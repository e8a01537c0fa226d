/**
 * The words and markup of a Phasewright mail, apart from sending it (lib/mail.ts), so the demo
 * seed can store the same messages in the mailbox without a mail server.
 */
import escapeHtml from 'escape-html';

export interface OutgoingMail {
  to: string;
  subject: string;
  /** Paragraphs of the message, plain text. */
  paragraphs: string[];
  /** A quoted message from a person (shown set apart). */
  quote?: string;
  link?: { label: string; url: string };
  /** The team the message is about; sent as X-Phasewright-Team so the demo mailbox can show each team its own mail. */
  teamId?: number;
}

/** The plain-text and HTML bodies of a message. */
export function renderMail(m: OutgoingMail): { text: string; html: string } {
  const text = [
    ...m.paragraphs,
    ...(m.quote ? [m.quote.split('\n').map((l) => `> ${l}`).join('\n')] : []),
    ...(m.link ? [`${m.link.label}: ${m.link.url}`] : []),
    '— Phasewright',
  ].join('\n\n');
  const p = (s: string) => `<p style="margin:0 0 12px">${escapeHtml(s)}</p>`;
  const html = `<!doctype html><html><body style="font-family:system-ui,sans-serif;color:#0f172a;max-width:560px">
${m.paragraphs.map(p).join('\n')}
${m.quote ? `<blockquote style="margin:0 0 12px;padding:8px 12px;border-left:3px solid #6366f1;background:#f1f5f9;white-space:pre-wrap">${escapeHtml(m.quote)}</blockquote>` : ''}
${m.link ? `<p style="margin:16px 0"><a href="${escapeHtml(m.link.url)}" style="background:#4f46e5;color:#fff;padding:8px 14px;border-radius:6px;text-decoration:none">${escapeHtml(m.link.label)}</a></p><p style="font-size:12px;color:#64748b">${escapeHtml(m.link.url)}</p>` : ''}
<p style="font-size:12px;color:#64748b">— Phasewright</p>
</body></html>`;
  return { text, html };
}
