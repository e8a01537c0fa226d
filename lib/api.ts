import 'server-only';
import { NextResponse } from 'next/server';
import type { z } from 'zod';
import { EngineInputError, type FieldIssue } from '@/lib/engine/types';
import { RevisionConflictError } from '@/db/queries/revisions';
import { MembershipError } from '@/db/queries/users';
import { InvitationError } from '@/db/queries/invitations';
import { HashBusyError } from './password-hash';
import { SwitchingBusyError } from './switching-busy';
import type { Role } from '@/db/schema';
import { zodIssues } from '@/lib/validation/analyze';
import { getCurrentUser, type CurrentUser } from './auth';

/** An expected failure with its HTTP status; `issues` name the fields. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly issues?: FieldIssue[],
    readonly extra?: Record<string, unknown>,
  ) {
    super(message);
  }
}

export function jsonError(status: number, error: string, issues?: FieldIssue[], extra?: Record<string, unknown>) {
  return NextResponse.json({ error, ...(issues ? { issues } : {}), ...extra }, { status });
}

/** Parse a JSON body with a zod schema: malformed JSON or a misfit body → 400 naming the field. */
export async function parseJson<S extends z.ZodType>(req: Request, schema: S): Promise<z.infer<S>> {
  let body: unknown;
  try {
    body = await req.json();
  } catch {
    throw new HttpError(400, 'The request body is not valid JSON', [{ path: '(body)', message: 'expected a JSON object' }]);
  }
  const r = schema.safeParse(body);
  if (!r.success) throw new HttpError(400, 'The request body does not fit the expected form', zodIssues(r.error));
  return r.data;
}

/** Route params arrive as strings; ids must be positive integers. */
export function parseId(value: string | undefined, field: string): number {
  const n = Number(value);
  if (!Number.isInteger(n) || n <= 0) throw new HttpError(404, `No ${field} ${value ?? ''}`.trim());
  return n;
}

export function toErrorResponse(err: unknown) {
  if (err instanceof HttpError) return jsonError(err.status, err.message, err.issues, err.extra);
  if (err instanceof EngineInputError)
    return jsonError(422, 'The design is not physically possible as entered', err.issues);
  if (err instanceof RevisionConflictError)
    return jsonError(409, err.message, undefined, { baseRevision: err.baseRevision, latestRevision: err.latestRevision });
  if (err instanceof MembershipError) return jsonError(422, err.message, [{ path: err.field, message: err.message }]);
  if (err instanceof InvitationError) return jsonError(err.status, err.message, [{ path: err.field, message: err.message }]);
  if (err instanceof HashBusyError) return NextResponse.json({ error: err.message }, { status: 429, headers: { 'retry-after': '5' } });
  if (err instanceof SwitchingBusyError)
    return NextResponse.json({ error: err.message }, { status: 503, headers: { 'retry-after': String(err.retryAfterSeconds) } });
  console.error(err);
  return jsonError(500, 'Something went wrong on the server; nothing was changed');
}

type Ctx<P> = { params: Promise<P> };

/** Largest JSON body a route reads unless it says otherwise (bytes). */
export const JSON_MAX_BYTES = 256 * 1024;

/** What a write route reads: JSON (the default), or an upload (multipart form or a raw text/CSV file). */
export type BodyKind = 'json' | 'upload';

const WRITE_METHODS = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

function typeOf(req: Request) {
  return (req.headers.get('content-type') ?? '').split(';')[0].trim().toLowerCase();
}

function accepts(kind: BodyKind, type: string) {
  if (type === 'application/json') return true;
  return kind === 'upload' && (type === 'multipart/form-data' || type === 'text/plain' || type === 'text/csv' || type === 'text/tab-separated-values' || type === 'application/octet-stream');
}

/** The origins this app answers as: the request's own host and the configured public URL. */
function ownOrigins(req: Request): Set<string> {
  const out = new Set<string>();
  const url = new URL(req.url);
  out.add(url.origin);
  const host = req.headers.get('host');
  if (host) {
    out.add(`http://${host}`);
    out.add(`https://${host}`);
  }
  for (const configured of [process.env.PHASEWRIGHT_PUBLIC_URL, process.env.NEXTAUTH_URL]) {
    if (!configured) continue;
    try {
      out.add(new URL(configured).origin);
    } catch {
      /* not a URL: ignored */
    }
  }
  return out;
}

/**
 * Cross-site write protection for every write route: a browser's request from
 * another origin (another site, another port, a subdomain) is refused, and the
 * body must be JSON (or an upload where the route takes one) — a plain HTML
 * form or a text/plain fetch cannot reach the handler. Clients without an
 * Origin header (curl, scripts with an API token) pass this check.
 */
export function checkWriteRequest(req: Request, kind: BodyKind): Response | null {
  if (!WRITE_METHODS.has(req.method)) return null;
  const origin = req.headers.get('origin');
  const site = req.headers.get('sec-fetch-site');
  if ((origin && origin !== 'null' && !ownOrigins(req).has(origin)) || origin === 'null' || site === 'cross-site' || site === 'same-site')
    return jsonError(403, 'Writes are accepted only from Phasewright itself; this request came from another site');
  const hasBody = Number(req.headers.get('content-length') ?? 0) > 0 || req.headers.has('transfer-encoding');
  const type = typeOf(req);
  if ((hasBody || type) && !accepts(kind, type))
    return jsonError(
      415,
      kind === 'upload'
        ? 'Send the upload as multipart/form-data or as a text file, or JSON with content-type application/json'
        : 'Send the body as JSON with content-type application/json',
      [{ path: '(content-type)', message: `${type || 'no content type'} is not accepted here` }],
    );
  return null;
}

function tooLarge(limit: number) {
  const size = limit >= 1024 * 1024 ? `${Math.round((limit / 1024 / 1024) * 10) / 10} MB` : `${Math.round(limit / 1024)} KB`;
  return new HttpError(413, `The request body is too large; this route takes at most ${size}`, [{ path: '(body)', message: `at most ${limit} bytes` }]);
}

/**
 * The body read with a byte counter: refused (413) as soon as it passes
 * `limit`, before anything is parsed, whether or not a Content-Length was
 * sent. Returns a request the handler can read as usual.
 */
export async function limitBody(req: Request, limit: number): Promise<Request> {
  if (!req.body || req.method === 'GET' || req.method === 'HEAD') return req;
  const declared = Number(req.headers.get('content-length') ?? NaN);
  if (declared > limit) throw tooLarge(limit);
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > limit) {
      await reader.cancel().catch(() => undefined);
      throw tooLarge(limit);
    }
    chunks.push(value);
  }
  const headers = new Headers(req.headers);
  headers.delete('transfer-encoding');
  headers.set('content-length', String(total));
  return new Request(req.url, { method: req.method, headers, body: Buffer.concat(chunks) });
}

export interface RouteOptions {
  allow?: (role: Role) => boolean;
  action?: string;
  /** 'json' (default) or 'upload' (multipart/text files too). */
  body?: BodyKind;
  /** Largest body read, bytes (default JSON_MAX_BYTES). */
  maxBytes?: number;
}

/**
 * Wrap a route handler: writes from another origin → 403, a body that is not
 * JSON (or an upload where allowed) → 415; 401 without a session (cookie or
 * API token); 403 when `allow` refuses the role; a body over `maxBytes` → 413
 * before parsing; typed errors mapped to their status. Role checks live here, not in UI.
 */
export function withUser<P = Record<string, string>>(
  handler: (req: Request, ctx: { user: CurrentUser; params: P }) => Promise<Response>,
  opts: RouteOptions = {},
) {
  return async (req: Request, ctx: Ctx<P>) => {
    try {
      const refused = checkWriteRequest(req, opts.body ?? 'json');
      if (refused) return refused;
      const user = await getCurrentUser();
      if (!user) return jsonError(401, 'Sign in first');
      if (opts.allow && !opts.allow(user.role))
        return jsonError(403, `Your role (${user.role}) may not ${opts.action ?? 'do this'}`);
      const params = ctx?.params ? await ctx.params : ({} as P);
      const limited = await limitBody(req, opts.maxBytes ?? JSON_MAX_BYTES);
      return await handler(limited, { user, params });
    } catch (err) {
      return toErrorResponse(err);
    }
  };
}

/**
 * For the few routes open without a session (accepting an invitation): the
 * same cross-site, content-type and body-size rules as withUser; `user` is
 * null when nobody is signed in.
 */
export function withOptionalUser(
  handler: (req: Request, ctx: { user: CurrentUser | null }) => Promise<Response>,
  opts: Pick<RouteOptions, 'maxBytes'> = {},
) {
  return async (req: Request) => {
    try {
      const refused = checkWriteRequest(req, 'json');
      if (refused) return refused;
      const user = await getCurrentUser();
      const limited = await limitBody(req, opts.maxBytes ?? JSON_MAX_BYTES);
      return await handler(limited, { user });
    } catch (err) {
      return toErrorResponse(err);
    }
  };
}
