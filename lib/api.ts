import 'server-only';
import { NextResponse } from 'next/server';
import type { z } from 'zod';
import { EngineInputError, type FieldIssue } from '@/lib/engine/types';
import { RevisionConflictError } from '@/db/queries/revisions';
import { MembershipError } from '@/db/queries/users';
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

/** Parse the URL's query parameters with a zod schema: a misfit → 400 naming the parameter. */
export function parseQuery<S extends z.ZodType>(req: Request, schema: S): z.infer<S> {
  const r = schema.safeParse(Object.fromEntries(new URL(req.url).searchParams));
  if (!r.success) throw new HttpError(400, 'The query parameters do not fit the expected form', zodIssues(r.error));
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
  console.error(err);
  return jsonError(500, 'Something went wrong on the server; nothing was changed');
}

type Ctx<P> = { params: Promise<P> };

/**
 * Wrap a route handler: 401 without a session, 403 when `allow` refuses the
 * role, typed errors mapped to their status. Role checks live here, not in UI.
 */
export function withUser<P = Record<string, string>>(
  handler: (req: Request, ctx: { user: CurrentUser; params: P }) => Promise<Response>,
  opts: { allow?: (role: Role) => boolean; action?: string } = {},
) {
  return async (req: Request, ctx: Ctx<P>) => {
    try {
      const user = await getCurrentUser();
      if (!user) return jsonError(401, 'Sign in first');
      if (opts.allow && !opts.allow(user.role))
        return jsonError(403, `Your role (${user.role}) may not ${opts.action ?? 'do this'}`);
      const params = ctx?.params ? await ctx.params : ({} as P);
      return await handler(req, { user, params });
    } catch (err) {
      return toErrorResponse(err);
    }
  };
}
