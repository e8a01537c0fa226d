/**
 * The client's one way to call our API: `requestJson` for reads (TanStack Query's
 * queryFn), `sendJson` for writes (a mutation's mutationFn). Every failure is an
 * ApiError carrying the server's one error shape, `{ error, issues? }`;
 * `showServerErrors` puts those issues beside the react-hook-form fields they name.
 */
import type { FieldIssue } from '@/lib/engine/types';

/** What every route answers on failure (lib/api.ts). */
export interface ApiErrorBody {
  error?: string;
  issues?: FieldIssue[];
  baseRevision?: number | null;
  latestRevision?: number | null;
}

/** A failed API call with the server's answer. Status 0: the server could not be reached. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly body: ApiErrorBody,
  ) {
    super(body.error ?? `Request failed (${status})`);
    this.name = 'ApiError';
  }

  /** The first field's message, else the error line. */
  get firstMessage(): string {
    return this.body.issues?.[0]?.message ?? this.message;
  }
}

export async function requestJson<T>(url: string, init?: RequestInit): Promise<T> {
  let res: Response;
  try {
    res = await fetch(url, init);
  } catch {
    throw new ApiError(0, { error: 'The server could not be reached; check the connection and try again' });
  }
  const body = res.status === 204 ? {} : await res.json().catch(() => ({}));
  if (!res.ok) throw new ApiError(res.status, body);
  return body as T;
}

/** POST/PATCH/PUT/DELETE a JSON body. */
export const sendJson = <T>(url: string, method: 'POST' | 'PATCH' | 'PUT' | 'DELETE', body?: unknown) =>
  requestJson<T>(url, {
    method,
    headers: body === undefined ? undefined : { 'content-type': 'application/json' },
    body: body === undefined ? undefined : JSON.stringify(body),
  });

/**
 * Show a failed write on a react-hook-form form: each issue whose path is a field of the form
 * goes beside that field, the rest (and the error line) to `root`.
 */
export function showServerErrors<F extends string>(
  err: unknown,
  fields: readonly F[],
  setError: (name: F | 'root', error: { message: string }) => void,
  fallback = 'That did not work; nothing was changed',
) {
  if (!(err instanceof ApiError)) {
    setError('root', { message: err instanceof Error ? err.message : fallback });
    return;
  }
  let placed = false;
  for (const issue of err.body.issues ?? []) {
    const field = fields.find((f) => issue.path === f || issue.path.endsWith(`.${f}`));
    if (field) {
      setError(field, { message: issue.message });
      placed = true;
    }
  }
  if (!placed) setError('root', { message: err.firstMessage || fallback });
}
