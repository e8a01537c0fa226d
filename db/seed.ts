/**
 * Demo data: an invented company's power team, four accounts (one per role)
 * and three designs with a first revision each. Idempotent: running it again
 * changes nothing. Only run when PHASEWRIGHT_DEMO=1 (see instrumentation.ts).
 */
import { eq } from 'drizzle-orm';
import { analyze } from '@/lib/engine/analyze';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import { summarizeAnalysis } from '@/lib/revision-summary';
import type { Db } from './connection';
import { createDesign, createRevision, createTeam, createUser, getUserByEmail, listDesigns } from './queries';
import { memberships, teams, type Role } from './schema';

export const DEMO_PASSWORD = 'phasewright-demo';
export const DEMO_TEAM = { name: 'Northwind Robotics — Power', slug: 'northwind-power' };
export const DEMO_USERS: { email: string; name: string; role: Role }[] = [
  { email: 'admin@demo.test', name: 'Ada Admin', role: 'admin' },
  { email: 'designer@demo.test', name: 'Dara Designer', role: 'designer' },
  { email: 'reviewer@demo.test', name: 'Rui Reviewer', role: 'reviewer' },
  { email: 'viewer@demo.test', name: 'Vic Viewer', role: 'viewer' },
];

export function seedDemo(db: Db) {
  db.transaction((tx) => {
    const t = tx as unknown as Db;
    const team = t.select().from(teams).where(eq(teams.slug, DEMO_TEAM.slug)).get() ?? createTeam(t, DEMO_TEAM);
    const ids: Record<string, number> = {};
    for (const u of DEMO_USERS) {
      const user = getUserByEmail(t, u.email) ?? createUser(t, { ...u, password: DEMO_PASSWORD });
      ids[u.role] = user.id;
      t.insert(memberships).values({ userId: user.id, teamId: team.id, role: u.role }).onConflictDoNothing().run();
    }
    const existing = new Set(listDesigns(t, team.id).map((d) => d.name));
    for (const sample of SAMPLE_DESIGNS) {
      if (existing.has(sample.name)) continue;
      const design = createDesign(t, ids.designer, team.id, {
        name: sample.name,
        description: sample.description,
        topology: sample.input.converter.topology,
      });
      createRevision(t, {
        teamId: team.id,
        designId: design.id,
        baseNumber: null,
        input: sample.input,
        summary: summarizeAnalysis(analyze(sample.input)),
        authorId: ids.designer,
        note: 'First pass from the power-stage datasheet values',
      });
    }
  });
}
