import NextAuth from 'next-auth';
import { authOptions } from '@/lib/auth';
import { beginSignIn, clientAddress } from '@/lib/signin-limit';

const handler = NextAuth(authOptions);
type Ctx = { params: Promise<{ nextauth: string[] }> };

/** A session cookie in the answer means the sign-in worked. */
const signedIn = (res: Response) => res.headers.getSetCookie().some((c) => /^(__Secure-)?next-auth\.session-token(\.\d+)?=[^;]/.test(c));

/**
 * next-auth, with failed sign-ins limited per account and per address
 * (lib/signin-limit.ts): over the limit → 429 with Retry-After, and a body
 * next-auth's client reads as the error "TooManyAttempts".
 */
async function POST(req: Request, ctx: Ctx) {
  const { nextauth } = await ctx.params;
  if (nextauth.join('/') !== 'callback/credentials') return handler(req, ctx);
  const form = await req
    .clone()
    .formData()
    .catch(() => null);
  const email = String(form?.get('email') ?? '');
  const attempt = await beginSignIn(email, clientAddress(req.headers));
  if (!attempt.ok) {
    const url = new URL('/signin?error=TooManyAttempts', req.url).toString();
    return Response.json(
      { url, error: `Too many failed sign-ins; try again in ${attempt.retryAfterSeconds} s` },
      { status: 429, headers: { 'retry-after': String(attempt.retryAfterSeconds) } },
    );
  }
  const res: Response = await handler(req, ctx);
  if (signedIn(res)) await attempt.succeeded();
  return res;
}

export { handler as GET, POST };
