/**
 * A team of a test's own, written straight into the test server's database,
 * so a test may change team settings without touching the demo team. Each
 * member gets their own signed-in client (they belong to this team only).
 */
import { openDatabase, type Db } from '@/db/connection';
import { createTeam, createUser } from '@/db/queries';
import { memberships, type Role } from '@/db/schema';
import { Client } from './http';

export const OWN_TEAM_PASSWORD = 'own-team-password';

export async function ownTeam<K extends string>(baseUrl: string, dbPath: string, slug: string, members: Record<K, Role>) {
  const db = openDatabase(dbPath);
  let teamId = 0;
  const ids = {} as Record<K, number>;
  const emails = {} as Record<K, string>;
  try {
    db.transaction(
      (tx) => {
        const t = tx as unknown as Db;
        teamId = createTeam(t, { name: `Team ${slug}`, slug }).id;
        for (const [key, role] of Object.entries(members) as [K, Role][]) {
          const email = `${key}@${slug}.test`;
          const user = createUser(t, { email, name: `${key} of ${slug}`, password: OWN_TEAM_PASSWORD });
          t.insert(memberships).values({ userId: user.id, teamId, role }).run();
          ids[key] = user.id;
          emails[key] = email;
        }
      },
      { behavior: 'immediate' },
    );
  } finally {
    db.$client.close();
  }
  const clients = {} as Record<K, Client>;
  for (const key of Object.keys(members) as K[]) {
    const c = new Client(baseUrl);
    const { signedIn } = await c.signIn(emails[key], OWN_TEAM_PASSWORD);
    if (!signedIn) throw new Error(`${emails[key]} could not sign in`);
    clients[key] = c;
  }
  return { teamId, ids, emails, clients };
}
