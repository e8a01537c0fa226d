import 'server-only';
import nodemailer, { type Transporter } from 'nodemailer';
import { renderMail, type OutgoingMail } from './mail-render';

export { renderMail, type OutgoingMail };

/**
 * Outgoing mail over SMTP with nodemailer. The server is SMTP_HOST
 * (default 127.0.0.1) on SMTP_PORT (default 2525); in the demo and the tests
 * that is the local fake mail server. Sending never throws: a failed
 * notification is logged and must not undo a sign-off.
 */

export const MAIL_FROM = process.env.MAIL_FROM ?? 'Phasewright <noreply@phasewright.local>';

let cached: { key: string; transport: Transporter } | undefined;

function transport(): Transporter | null {
  const port = Number(process.env.SMTP_PORT || 2525);
  if (!Number.isInteger(port) || port <= 0) return null;
  const host = process.env.SMTP_HOST ?? '127.0.0.1';
  const key = `${host}:${port}`;
  if (cached?.key !== key) {
    cached = {
      key,
      transport: nodemailer.createTransport({
        host,
        port,
        secure: false,
        ignoreTLS: host === '127.0.0.1' || host === 'localhost',
        connectionTimeout: 5_000,
        greetingTimeout: 5_000,
        socketTimeout: 10_000,
      }),
    };
  }
  return cached.transport;
}

export async function sendMail(m: OutgoingMail): Promise<{ sent: boolean; error?: string }> {
  const t = transport();
  if (!t) {
    console.warn(`[mail] SMTP_PORT is not a port number; not sending "${m.subject}" to ${m.to}`);
    return { sent: false, error: 'SMTP_PORT is not a port number' };
  }
  try {
    await t.sendMail({
      from: MAIL_FROM,
      to: m.to,
      subject: m.subject,
      ...renderMail(m),
      ...(m.teamId ? { headers: { 'X-Phasewright-Team': String(m.teamId) } } : {}),
    });
    return { sent: true };
  } catch (err) {
    const error = err instanceof Error ? err.message : String(err);
    console.error(`[mail] could not send "${m.subject}" to ${m.to}: ${error}`);
    return { sent: false, error };
  }
}

/**
 * The app's public origin for links in mail: PHASEWRIGHT_PUBLIC_URL, else
 * NEXTAUTH_URL, else http://localhost:PORT. Never a request header: a crafted
 * Host or X-Forwarded-Host must not put another site's address in a mail.
 */
export async function appBaseUrl(): Promise<string> {
  const configured = process.env.PHASEWRIGHT_PUBLIC_URL || process.env.NEXTAUTH_URL;
  if (configured) return configured.replace(/\/+$/, '');
  return `http://localhost:${process.env.PORT ?? 3000}`;
}
