export interface ApiAnswer<T = Record<string, unknown>> {
  ok: boolean;
  status: number;
  body: T & { error?: string; issues?: { path: string; message: string }[] };
}

/** POST JSON to one of our routes; never throws on an HTTP error, only answers it. */
export async function postJson<T = Record<string, unknown>>(url: string, body: unknown): Promise<ApiAnswer<T>> {
  try {
    const res = await fetch(url, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
    return { ok: res.ok, status: res.status, body: await res.json().catch(() => ({})) };
  } catch {
    return { ok: false, status: 0, body: { error: 'The server could not be reached; nothing was changed' } as ApiAnswer<T>['body'] };
  }
}

/** The first field error, else the error line. */
export function answerMessage(a: ApiAnswer): string {
  const issue = a.body.issues?.[0];
  return issue ? issue.message : (a.body.error ?? `Request failed (${a.status})`);
}
