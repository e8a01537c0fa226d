import 'server-only';
import { cookies } from 'next/headers';
import { redirect } from 'next/navigation';
import { getServerSession, type NextAuthOptions } from 'next-auth';
import CredentialsProvider from 'next-auth/providers/credentials';
import { getDb } from '@/db/client';
import { listTeamsForUser, verifyCredentials } from '@/db/queries';
import type { Role } from '@/db/schema';
import { getAuthSecret } from './auth-secret';

export const TEAM_COOKIE = 'pw-team';

// Without NEXTAUTH_URL, take the origin from the request's Host header so the
// app signs in on whatever host and PORT it is served (set NEXTAUTH_URL behind a proxy).
process.env.AUTH_TRUST_HOST ??= '1';

export const authOptions: NextAuthOptions = {
  secret: getAuthSecret(),
  session: { strategy: 'jwt', maxAge: 60 * 60 * 12 },
  pages: { signIn: '/signin' },
  providers: [
    CredentialsProvider({
      name: 'Email and password',
      credentials: { email: { label: 'Email', type: 'email' }, password: { label: 'Password', type: 'password' } },
      async authorize(credentials) {
        if (!credentials?.email || !credentials.password) return null;
        const user = verifyCredentials(getDb(), credentials.email, credentials.password);
        return user ? { id: String(user.id), email: user.email, name: user.name } : null;
      },
    }),
  ],
  callbacks: {
    jwt({ token, user }) {
      if (user) token.userId = Number(user.id);
      return token;
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

export function getSession() {
  return getServerSession(authOptions);
}

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

/**
 * The signed-in user with the current team (cookie `pw-team`, else their
 * first team) and their role in it; null without a session or without any team.
 */
export async function getCurrentUser(): Promise<CurrentUser | null> {
  const session = await getSession();
  const id = session?.user?.id;
  if (!id) return null;
  const teams = listTeamsForUser(getDb(), id);
  if (teams.length === 0) return null;
  const wanted = await readTeamCookie();
  const current = teams.find((t) => t.teamId === wanted) ?? teams[0];
  return {
    id,
    email: session.user.email ?? '',
    name: session.user.name ?? '',
    teamId: current.teamId,
    teamName: current.teamName,
    role: current.role,
    teams: teams.map((t) => ({ teamId: t.teamId, teamName: t.teamName, role: t.role })),
  };
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
