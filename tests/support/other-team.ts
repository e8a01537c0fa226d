/**
 * A second team for scoping tests, written straight into the test server's
 * database: one designer ("outsider") and one design with a revision. Neither
 * team may see the other's designs (404).
 */
import { eq } from 'drizzle-orm';
import { openDatabase } from '@/db/connection';
import { createDesign, createRevision, createTeam, createUser, getUserByEmail } from '@/db/queries';
import { memberships, revisions, teams } from '@/db/schema';
import { Client } from './http';

export const OUTSIDER = { email: 'outsider@harbor.test', password: 'harbor-outsider-pw', name: 'Oli Outsider' };

export async function otherTeam(baseUrl: string, dbPath: string) {
  const db = openDatabase(dbPath);
  let ids: { designId: number; teamId: number; userId: number };
  try {
    // Two test files may ask at once: one immediate transaction each.
    ids = db.transaction(
      (t) => {
        const team = t.select().from(teams).where(eq(teams.slug, 'harbor-power')).get() ?? createTeam(t, { name: 'Harbor Instruments — Power', slug: 'harbor-power' });
        let user = getUserByEmail(t, OUTSIDER.email);
        if (!user) {
          user = createUser(t, OUTSIDER);
          t.insert(memberships).values({ userId: user.id, teamId: team.id, role: 'admin' }).run();
        }
        const sample = t.select().from(revisions).limit(1).get()!;
        const topology = sample.input.converter.topology;
        const design = createDesign(t, user.id, team.id, { name: 'Harbor 12 V bus', topology });
        createRevision(t, { teamId: team.id, designId: design.id, baseNumber: null, input: sample.input, summary: sample.summary, authorId: user.id, note: 'theirs' });
        return { designId: design.id, teamId: team.id, userId: user.id };
      },
      { behavior: 'immediate' },
    );
  } finally {
    db.$client.close();
  }
  const client = new Client(baseUrl);
  const { signedIn } = await client.signIn(OUTSIDER.email, OUTSIDER.password);
  if (!signedIn) throw new Error('the outsider could not sign in');
  return { client, ...ids };
}
