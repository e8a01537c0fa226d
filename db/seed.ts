/**
 * Demo data: an invented company's power team, four accounts (one per role),
 * three designs with a first revision each, and the review story of
 * db/seed-story.ts (a design taken through three revisions, remarks, bench data
 * and an approval, with its mail; a design waiting for the demo reviewer).
 * Idempotent: running it again changes nothing. Only run when PHASEWRIGHT_DEMO=1
 * (see instrumentation.ts).
 */
import { eq } from 'drizzle-orm';
import { analyze } from '@/lib/engine/analyze';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import { summarizeAnalysis } from '@/lib/revision-summary';
import type { Db } from './connection';
import { createDesign, createRevision, createTeam, createUser, getUserByEmail, listDesigns } from './queries';
import { memberships, teams, type Role } from './schema';
import { seedStories } from './seed-story';

export const DEMO_PASSWORD = 'phasewright-demo';
export const DEMO_TEAM = { name: 'Northwind Robotics — Power', slug: 'northwind-power' };
/** A second team, so the team switcher and per-team roles can be tried: the designer only reads there. */
export const DEMO_SECOND_TEAM = { name: 'Northwind Robotics — Lab instruments', slug: 'northwind-lab' };
const SECOND_TEAM_ROLES: Record<string, Role> = { 'admin@demo.test': 'admin', 'designer@demo.test': 'viewer' };

export const DEMO_USERS: { email: string; name: string; role: Role }[] = [
  { email: 'admin@demo.test', name: 'Ada Admin', role: 'admin' },
  { email: 'designer@demo.test', name: 'Dara Designer', role: 'designer' },
  { email: 'reviewer@demo.test', name: 'Rui Reviewer', role: 'reviewer' },
  { email: 'viewer@demo.test', name: 'Vic Viewer', role: 'viewer' },
];

/** The invented company's three converters, each built on one engine sample. */
const DEMO_DESIGNS: { sample: string; name: string; description: string }[] = [
  { sample: 'buck-24v-5v', name: '5 V logic rail — arm controller', description: '24 V bus to 5 V / 3 A, ceramic output' },
  { sample: 'boost-3v7-12v', name: '12 V sensor supply — handheld probe', description: 'One Li-ion cell to 12 V / 0.5 A' },
  { sample: 'buck-boost-12v-n12v', name: '−12 V bias — motor current amplifier', description: '12 V to −12 V / 1 A, inverting' },
];

export function seedDemo(db: Db) {
  db.transaction((t) => {
    const team = t.select().from(teams).where(eq(teams.slug, DEMO_TEAM.slug)).get() ?? createTeam(t, DEMO_TEAM);
    const ids: Record<string, number> = {};
    const people: Record<string, { id: number; email: string; name: string }> = {};
    for (const u of DEMO_USERS) {
      const user = getUserByEmail(t, u.email) ?? createUser(t, { ...u, password: DEMO_PASSWORD });
      ids[u.role] = user.id;
      people[u.role] = { id: user.id, email: user.email, name: user.name };
      t.insert(memberships).values({ userId: user.id, teamId: team.id, role: u.role }).onConflictDoNothing().run();
    }
    const lab = t.select().from(teams).where(eq(teams.slug, DEMO_SECOND_TEAM.slug)).get() ?? createTeam(t, DEMO_SECOND_TEAM);
    for (const [email, role] of Object.entries(SECOND_TEAM_ROLES)) {
      const user = getUserByEmail(t, email)!;
      t.insert(memberships).values({ userId: user.id, teamId: lab.id, role }).onConflictDoNothing().run();
    }
    const existing = new Set(listDesigns(t, team.id, { archived: 'all' }).map((d) => d.name));
    for (const demo of DEMO_DESIGNS) {
      if (existing.has(demo.name)) continue;
      const sample = SAMPLE_DESIGNS.find((s) => s.key === demo.sample);
      if (!sample) throw new Error(`engine sample ${demo.sample} is missing`);
      const design = createDesign(t, ids.designer, team.id, {
        name: demo.name,
        description: demo.description,
        topology: sample.request.converter.topology,
      });
      createRevision(t, {
        teamId: team.id,
        designId: design.id,
        baseNumber: null,
        input: sample.request,
        summary: summarizeAnalysis(analyze(sample.request)),
        authorId: ids.designer,
        note: 'First pass from the power-stage datasheet values',
      });
    }
    const now = new Map(listDesigns(t, team.id, { archived: 'all' }).map((d) => [d.name, { id: d.id, latestRevision: d.latestRevision }]));
    seedStories(t, team.id, { designer: people.designer, reviewer: people.reviewer, admin: people.admin }, now);
  });
}
