/**
 * A tiny cookie-keeping client that signs in through the real next-auth
 * endpoints: GET /api/auth/csrf, then POST /api/auth/callback/credentials.
 */
export class Client {
  private cookies = new Map<string, string>();
  constructor(readonly baseUrl: string) {}

  private keep(res: Response) {
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';');
      const i = pair.indexOf('=');
      this.cookies.set(pair.slice(0, i), pair.slice(i + 1));
    }
  }

  cookieHeader() {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  }

  async fetch(path: string, init: RequestInit = {}) {
    const headers = new Headers(init.headers);
    if (this.cookies.size) headers.set('cookie', this.cookieHeader());
    const res = await fetch(this.baseUrl + path, { ...init, headers, redirect: 'manual' });
    this.keep(res);
    return res;
  }

  json(path: string, method: string, body?: unknown) {
    return this.fetch(path, {
      method,
      headers: { 'content-type': 'application/json' },
      body: body === undefined ? undefined : typeof body === 'string' ? body : JSON.stringify(body),
    });
  }

  async signIn(email: string, password: string) {
    const csrf = (await (await this.fetch('/api/auth/csrf')).json()) as { csrfToken: string };
    const res = await this.fetch('/api/auth/callback/credentials', {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({ csrfToken: csrf.csrfToken, email, password, json: 'true' }),
    });
    return { res, signedIn: this.cookies.has('next-auth.session-token') };
  }
}

export const DEMO_PASSWORD = 'phasewright-demo';

export async function signedInAs(baseUrl: string, role: 'admin' | 'designer' | 'reviewer' | 'viewer') {
  const c = new Client(baseUrl);
  const { signedIn } = await c.signIn(`${role}@demo.test`, DEMO_PASSWORD);
  if (!signedIn) throw new Error(`could not sign in as ${role}`);
  return c;
}
