import 'server-only';
import { cookies, headers } from 'next/headers';
import { redirect } from 'next/navigation';
import type { NextAuthOptions } from 'next-auth';
import { decode } from 'next-auth/jwt';
import CredentialsProvider from 'next-auth/providers/credentials';
import { getDb } from '@/db/client';
import { bumpSessionVersion, getSessionUser, getUserByEmail, getUserById, listTeamsForUser, userIdForApiToken } from '@/db/queries';
import type { Role } from '@/db/schema';
import { getAuthSecret } from './auth-secret';
import { comparePassword } from './password-hash';
import { safeCallbackUrl } from './safe-redirect';
import { signInSchema } from './validation/sign-in';

export const TEAM_COOKIE = 'pw-team';

// Without NEXTAUTH_URL, take the origin from the request's Host header so the
// app signs in on whatever host and PORT it is served (set NEXTAUTH_URL behind a proxy).
process.env.AUTH_TRUST_HOST ??= '1';

export const authOptions: NextAuthOptions = {
  secret: getAuthSecret(),
  session: { strategy: 'jwt', maxAge: 60 * 60 * 12 },
  pages: { signIn: '/signin' },
  events: {
    // Sign-out ends the session on the server too: every token of this user issued before now is refused.
    signOut({ token }) {
      const userId = Number(token?.userId);
      if (Number.isInteger(userId) && userId > 0) bumpSessionVersion(getDb(), userId);
    },
  },
  providers: [
    CredentialsProvider({
      name: 'Email and password',
      credentials: { email: { label: 'Email', type: 'email' }, password: { label: 'Password', type: 'password' } },
      async authorize(credentials) {
        const parsed = signInSchema.safeParse(credentials ?? {});
        if (!parsed.success) return null;
        const { email, password } = parsed.data;
        // An unknown e-mail is compared against a dummy hash: the same work and time as a wrong password.
        const user = getUserByEmail(getDb(), email);
        const ok = await comparePassword(password, user?.passwordHash);
        return user && ok ? { id: String(user.id), email: user.email, name: user.name, sessionVersion: user.sessionVersion } : null;
      },
    }),
  ],
  callbacks: {
    jwt({ token, user }) {
      if (user) {
        token.userId = Number(user.id);
        token.sv = 'sessionVersion' in user && typeof user.sessionVersion === 'number' ? user.sessionVersion : 0;
        return token;
      }
      // A token from before a sign-out, a password change or a removal carries an older version: drop its user.
      const current = token.userId ? getUserById(getDb(), Number(token.userId)) : undefined;
      if (!current || current.sessionVersion !== (token.sv ?? 0)) return {};
      return token;
    },
    // Only same-origin relative paths (lib/safe-redirect.ts), never another site.
    redirect({ url, baseUrl }) {
      const path = safeCallbackUrl(url.startsWith(baseUrl) ? url.slice(baseUrl.length) || '/' : url);
      return `${baseUrl}${path}`;
    },
    async session({ session, token }) {
      const userId = Number(token.userId);
      session.user = { ...session.user, id: userId };
      // Role is read fresh from the database so a role change applies at once.
      const current = await resolveCurrentTeam(userId);
      if (current) {
        session.user.teamId = current.teamId;
        session.user.role = current.role;
      }
      return session;
    },
  },
};

async function readTeamCookie(): Promise<number | null> {
  try {
    const v = (await cookies()).get(TEAM_COOKIE)?.value;
    return v ? Number(v) : null;
  } catch {
    return null; // outside a request scope
  }
}

async function resolveCurrentTeam(userId: number) {
  const teams = listTeamsForUser(getDb(), userId);
  if (teams.length === 0) return null;
  const wanted = await readTeamCookie();
  return teams.find((t) => t.teamId === wanted) ?? teams[0];
}

export interface CurrentUser {
  id: number;
  email: string;
  name: string;
  teamId: number;
  teamName: string;
  role: Role;
  teams: { teamId: number; teamName: string; role: Role }[];
}

// next-auth's cookie name; the __Secure- prefix is used when the app is served over https.
const SESSION_COOKIES = ['__Secure-next-auth.session-token', 'next-auth.session-token'];

/** The raw session token, joined when next-auth split a large one into `.0`, `.1`, … chunks. */
async function readSessionToken(): Promise<string | null> {
  let jar;
  try {
    jar = await cookies();
  } catch {
    return null; // outside a request scope
  }
  for (const name of SESSION_COOKIES) {
    const whole = jar.get(name)?.value;
    if (whole) return whole;
    const chunks: string[] = [];
    for (let i = 0; ; i++) {
      const part = jar.get(`${name}.${i}`)?.value;
      if (!part) break;
      chunks.push(part);
    }
    if (chunks.length) return chunks.join('');
  }
  return null;
}

/**
 * Decrypted session tokens, keyed by the token itself. Decrypting (key derivation + AES-GCM)
 * is most of the cost of a session check; a token's content never changes, so its payload is
 * kept until it expires (at most a few minutes, a bounded number of entries). What may change
 * — membership, role, the user's name — is read from the database on every request.
 */
const TOKEN_CACHE_MS = 5 * 60_000;
const TOKEN_CACHE_MAX = 1000;
const tokenCache = new Map<string, { userId: number; sv: number; keepUntilMs: number }>();

async function userIdFromToken(token: string): Promise<{ userId: number; sv: number } | null> {
  const now = Date.now();
  const hit = tokenCache.get(token);
  if (hit && hit.keepUntilMs > now) return hit;
  if (hit) tokenCache.delete(token);
  let payload;
  try {
    payload = await decode({ token, secret: authOptions.secret ?? getAuthSecret() });
  } catch {
    return null; // tampered, signed with another secret, or expired
  }
  const userId = Number(payload?.userId);
  const expMs = typeof payload?.exp === 'number' ? payload.exp * 1000 : now;
  if (!Number.isInteger(userId) || userId <= 0 || expMs <= now) return null;
  const sv = typeof payload?.sv === 'number' ? payload.sv : 0;
  if (tokenCache.size >= TOKEN_CACHE_MAX) tokenCache.clear();
  const entry = { userId, sv, keepUntilMs: Math.min(expMs, now + TOKEN_CACHE_MS) };
  tokenCache.set(token, entry);
  return entry;
}

/**
 * The signed-in user with the current team (cookie `pw-team`, else their
 * first team) and their role in it; null without a session or without any team.
 * Costs one indexed query per request (user + memberships); the token's decryption is cached.
 */
export async function getCurrentUser(): Promise<CurrentUser | null> {
  const bearer = await readBearerToken();
  let id: number;
  let sessionVersion: number | null = null;
  if (bearer !== null) {
    // A personal API token acts as its user, with that user's role in the current team.
    const owner = userIdForApiToken(getDb(), bearer);
    if (owner === null) return null;
    id = owner;
  } else {
    const token = await readSessionToken();
    if (!token) return null;
    const claims = await userIdFromToken(token);
    if (claims === null) return null;
    id = claims.userId;
    sessionVersion = claims.sv;
  }
  const found = getSessionUser(getDb(), id);
  if (!found || found.teams.length === 0) return null;
  // Sign-out, a password change or a removal from a team bump the version: older tokens stop working at once.
  if (sessionVersion !== null && found.sessionVersion !== sessionVersion) return null;
  const wanted = await readTeamCookie();
  const current = found.teams.find((t) => t.teamId === wanted) ?? found.teams[0];
  return {
    id,
    email: found.email,
    name: found.name,
    teamId: current.teamId,
    teamName: current.teamName,
    role: current.role,
    teams: found.teams.map((t) => ({ teamId: t.teamId, teamName: t.teamName, role: t.role })),
  };
}

/** `Authorization: Bearer <token>`, when the request carries one. */
async function readBearerToken(): Promise<string | null> {
  try {
    const auth = (await headers()).get('authorization');
    const m = auth?.match(/^Bearer\s+(\S+)$/i);
    return m ? m[1] : null;
  } catch {
    return null; // outside a request scope
  }
}

/** What each role may do; checked on the server in every handler and action. */
export const can = {
  editDesigns: (r: Role) => r === 'admin' || r === 'designer',
  review: (r: Role) => r === 'admin' || r === 'reviewer',
  remark: (r: Role) => r !== 'viewer',
  manageTeam: (r: Role) => r === 'admin',
};

/**
 * For server pages: the signed-in user, or a redirect to sign-in. Layouts and
 * pages render in parallel, so each page checks for itself.
 */
export async function requireUser(): Promise<CurrentUser> {
  const user = await getCurrentUser();
  if (!user) redirect('/signin');
  return user;
}
