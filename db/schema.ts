/**
 * Phasewright's SQLite schema (Drizzle). camelCase keys map to snake_case
 * columns; ids are integers; timestamps are ms since epoch.
 * Revisions are immutable: a migration adds a trigger refusing UPDATE (rows go
 * only with their design, by cascade).
 */
import { relations, sql } from 'drizzle-orm';
import { index, integer, primaryKey, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { TOPOLOGIES, type AnalyzeRequest } from '../lib/engine/types';
import type { BenchPoints } from '../lib/handoff/bench-parse';
import type { RevisionSummary } from '../lib/revision-summary';
import { ROLES, type Role } from '../lib/catalog/roles';
import { SIGNOFF_STATES, type SignoffState } from '../lib/catalog/signoff';

const createdAt = () =>
  integer('created_at', { mode: 'timestamp_ms' })
    .notNull()
    .default(sql`(unixepoch('subsec') * 1000)`);

export { ROLES, type Role };

export { SIGNOFF_STATES, type SignoffState };

export const users = sqliteTable('users', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  email: text('email').notNull().unique(),
  name: text('name').notNull(),
  passwordHash: text('password_hash').notNull(),
  /** Bumped by sign-out, a password change and a removal from a team; a session token carrying an older version is refused. */
  sessionVersion: integer('session_version').notNull().default(0),
  createdAt: createdAt(),
});

export const teams = sqliteTable('teams', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  name: text('name').notNull(),
  slug: text('slug').notNull().unique(),
  /** Whether the team's admins may also review and decide sign-offs (lib/signoff-policy.ts). */
  adminsMayReview: integer('admins_may_review', { mode: 'boolean' }).notNull().default(false),
  /**
   * Bumped by triggers whenever anything the designs list shows changes (a design row, an
   * owner's name, a sign-off event): the list API's cached pages are keyed by it
   * (migration team_list_version_triggers).
   */
  listVersion: integer('list_version').notNull().default(0),
  createdAt: createdAt(),
});

export const memberships = sqliteTable(
  'memberships',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    teamId: integer('team_id')
      .notNull()
      .references(() => teams.id, { onDelete: 'cascade' }),
    role: text('role', { enum: ROLES }).notNull(),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('memberships_user_team').on(t.userId, t.teamId)],
);

export const designs = sqliteTable(
  'designs',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    teamId: integer('team_id')
      .notNull()
      .references(() => teams.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    description: text('description').notNull().default(''),
    topology: text('topology', { enum: TOPOLOGIES }).notNull(),
    ownerId: integer('owner_id')
      .notNull()
      .references(() => users.id),
    /** Compensator part → schematic reference designator, e.g. { "r2": "R17" }. */
    designatorMap: text('designator_map', { mode: 'json' }).$type<Record<string, string>>().notNull().default({}),
    /** Set when archived (hidden from the list, read-only, restorable); revisions are never touched. */
    archivedAt: integer('archived_at', { mode: 'timestamp_ms' }),
    archivedBy: integer('archived_by').references(() => users.id),
    createdAt: createdAt(),
    updatedAt: integer('updated_at', { mode: 'timestamp_ms' })
      .notNull()
      .default(sql`(unixepoch('subsec') * 1000)`),
    /**
     * Number and sign-off state of the latest revision, kept by triggers on revisions and
     * signoff_events (migration designs_list_triggers) so the list filters and sorts on indexes.
     * Both null until the first save.
     */
    latestRevision: integer('latest_revision'),
    signoffState: text('signoff_state', { enum: SIGNOFF_STATES }),
  },
  // One index per sort of the designs list (the row id breaks ties, as in every index).
  (t) => [
    index('designs_team').on(t.teamId),
    index('designs_team_updated').on(t.teamId, t.updatedAt),
    index('designs_team_name').on(t.teamId, sql`${t.name} COLLATE NOCASE`),
    index('designs_team_topology').on(t.teamId, t.topology),
    index('designs_team_latest_revision').on(t.teamId, t.latestRevision),
    index('designs_team_signoff').on(t.teamId, t.signoffState),
  ],
);

/**
 * How many designs a team has per list bucket (archived or not, topology, state: `unsaved` before the
 * first save, else the sign-off state), kept by triggers on designs (migration design_counts_triggers).
 * The designs list's total is a sum over a few of these rows instead of a count over the team.
 */
export const designCounts = sqliteTable(
  'design_counts',
  {
    teamId: integer('team_id')
      .notNull()
      .references(() => teams.id, { onDelete: 'cascade' }),
    archived: integer('archived', { mode: 'boolean' }).notNull(),
    topology: text('topology', { enum: TOPOLOGIES }).notNull(),
    state: text('state').notNull(),
    n: integer('n').notNull().default(0),
  },
  (t) => [primaryKey({ columns: [t.teamId, t.archived, t.topology, t.state] })],
);

export const revisions = sqliteTable(
  'revisions',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    designId: integer('design_id')
      .notNull()
      .references(() => designs.id, { onDelete: 'cascade' }),
    number: integer('number').notNull(),
    /** The revision it was edited from (null for the first). */
    baseNumber: integer('base_number'),
    /** The full, validated analysis request (AnalyzeRequest). */
    input: text('input', { mode: 'json' }).$type<AnalyzeRequest>().notNull(),
    /** Computed summary: operating point, margins, parts, checks (no Bode arrays). */
    summary: text('summary', { mode: 'json' }).$type<RevisionSummary>().notNull(),
    authorId: integer('author_id')
      .notNull()
      .references(() => users.id),
    note: text('note').notNull().default(''),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('revisions_design_number').on(t.designId, t.number)],
);

/** Sign-off history of a revision; the latest event gives its state. */
export const signoffEvents = sqliteTable(
  'signoff_events',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    revisionId: integer('revision_id')
      .notNull()
      .references(() => revisions.id, { onDelete: 'cascade' }),
    state: text('state', { enum: SIGNOFF_STATES }).notNull(),
    actorId: integer('actor_id')
      .notNull()
      .references(() => users.id),
    /** For 'in-review': the reviewer asked. */
    reviewerId: integer('reviewer_id').references(() => users.id),
    message: text('message').notNull().default(''),
    createdAt: createdAt(),
  },
  (t) => [index('signoff_events_revision').on(t.revisionId)],
);

export const remarks = sqliteTable(
  'remarks',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    revisionId: integer('revision_id')
      .notNull()
      .references(() => revisions.id, { onDelete: 'cascade' }),
    authorId: integer('author_id')
      .notNull()
      .references(() => users.id),
    body: text('body').notNull(),
    /** Written on Compare: the number of the other revision on the plot (null when written on the revision alone). */
    comparedWith: integer('compared_with'),
    createdAt: createdAt(),
  },
  (t) => [index('remarks_revision').on(t.revisionId)],
);

/** Measured loop response uploaded from a network/frequency-response analyzer. */
export const benchData = sqliteTable(
  'bench_data',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    designId: integer('design_id')
      .notNull()
      .references(() => designs.id, { onDelete: 'cascade' }),
    /**
     * The revision measured (its model is the one compared). Null only for data uploaded before
     * bench data belonged to revisions to a design that had no revision then: shown design-wide.
     */
    revisionId: integer('revision_id').references(() => revisions.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    /** As uploaded: frequency rising, Hz / dB / degrees. */
    points: text('points', { mode: 'json' }).$type<BenchPoints>().notNull(),
    phaseShifted: integer('phase_shifted', { mode: 'boolean' }).notNull().default(false),
    uploadedBy: integer('uploaded_by')
      .notNull()
      .references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [index('bench_data_design').on(t.designId), index('bench_data_revision').on(t.revisionId)],
);

export const auditLog = sqliteTable(
  'audit_log',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    teamId: integer('team_id').references(() => teams.id, { onDelete: 'cascade' }),
    userId: integer('user_id').references(() => users.id),
    action: text('action').notNull(),
    entityType: text('entity_type').notNull(),
    entityId: integer('entity_id'),
    detail: text('detail', { mode: 'json' }).$type<Record<string, unknown>>().notNull().default({}),
    createdAt: createdAt(),
  },
  (t) => [index('audit_log_team').on(t.teamId)],
);

/**
 * An invitation to join a team, sent by e-mail whether or not the address has
 * an account (so the admin never learns which); accepted by the addressee.
 */
export const invitations = sqliteTable(
  'invitations',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    teamId: integer('team_id')
      .notNull()
      .references(() => teams.id, { onDelete: 'cascade' }),
    email: text('email').notNull(),
    role: text('role', { enum: ROLES }).notNull(),
    /** SHA-256 of the token in the mailed link (the token itself is never stored). */
    tokenHash: text('token_hash').notNull().unique(),
    invitedBy: integer('invited_by')
      .notNull()
      .references(() => users.id),
    expiresAt: integer('expires_at', { mode: 'timestamp_ms' }).notNull(),
    acceptedAt: integer('accepted_at', { mode: 'timestamp_ms' }),
    createdAt: createdAt(),
  },
  (t) => [index('invitations_team').on(t.teamId)],
);

/** Personal API tokens: `Authorization: Bearer <token>` acts as the user. Only a SHA-256 of the token is kept. */
export const apiTokens = sqliteTable(
  'api_tokens',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    tokenHash: text('token_hash').notNull().unique(),
    /** The first characters of the token, to tell tokens apart on the settings page. */
    prefix: text('prefix').notNull(),
    lastUsedAt: integer('last_used_at', { mode: 'timestamp_ms' }),
    createdAt: createdAt(),
  },
  (t) => [index('api_tokens_user').on(t.userId)],
);

/** Messages captured by the local fake SMTP server (demo and tests). */
export const mailbox = sqliteTable('mailbox', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  /** The team the message is about (X-Phasewright-Team header), null when none. */
  teamId: integer('team_id'),
  fromAddress: text('from_address').notNull(),
  toAddress: text('to_address').notNull(),
  subject: text('subject').notNull(),
  text: text('text').notNull().default(''),
  html: text('html').notNull().default(''),
  raw: text('raw').notNull(),
  createdAt: createdAt(),
},
  // The mailbox page lists one address's mail about one team, newest first, 100 a page.
  (t) => [index('mailbox_to_team').on(t.toAddress, t.teamId)],
);

export const usersRelations = relations(users, ({ many }) => ({ memberships: many(memberships) }));
export const teamsRelations = relations(teams, ({ many }) => ({
  memberships: many(memberships),
  designs: many(designs),
}));
export const membershipsRelations = relations(memberships, ({ one }) => ({
  user: one(users, { fields: [memberships.userId], references: [users.id] }),
  team: one(teams, { fields: [memberships.teamId], references: [teams.id] }),
}));
export const designsRelations = relations(designs, ({ one, many }) => ({
  team: one(teams, { fields: [designs.teamId], references: [teams.id] }),
  owner: one(users, { fields: [designs.ownerId], references: [users.id] }),
  revisions: many(revisions),
  benchData: many(benchData),
}));
export const revisionsRelations = relations(revisions, ({ one, many }) => ({
  design: one(designs, { fields: [revisions.designId], references: [designs.id] }),
  author: one(users, { fields: [revisions.authorId], references: [users.id] }),
  signoffEvents: many(signoffEvents),
  remarks: many(remarks),
}));

export type User = typeof users.$inferSelect;
export type Team = typeof teams.$inferSelect;
export type Membership = typeof memberships.$inferSelect;
export type Design = typeof designs.$inferSelect;
export type NewDesign = typeof designs.$inferInsert;
export type Revision = typeof revisions.$inferSelect;
export type SignoffEvent = typeof signoffEvents.$inferSelect;
export type Remark = typeof remarks.$inferSelect;
export type BenchData = typeof benchData.$inferSelect;
export type AuditEntry = typeof auditLog.$inferSelect;
export type MailMessage = typeof mailbox.$inferSelect;
export type Invitation = typeof invitations.$inferSelect;
export type ApiToken = typeof apiTokens.$inferSelect;
