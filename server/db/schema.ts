/**
 * Deckshare's database schema (SQLite through Drizzle). One file; migrations are generated
 * from it by drizzle-kit into server/db/migrations and applied at start-up.
 *
 * Immutability: deck versions, analysis results and the audit log are append-only. Triggers
 * in migration 0001 refuse UPDATE and DELETE on those tables, so not even a bug can change a
 * saved version.
 * Timestamps are ISO-8601 strings in UTC.
 */
import { sql } from 'drizzle-orm';
import { index, integer, primaryKey, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';

export const ROLES = ['admin', 'designer', 'reviewer', 'instructor', 'trainee'] as const;
export type Role = (typeof ROLES)[number];

const now = sql`(strftime('%Y-%m-%dT%H:%M:%fZ','now'))`;

export const firms = sqliteTable('firms', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  name: text('name').notNull(),
  createdAt: text('created_at').notNull().default(now),
});

export const users = sqliteTable(
  'users',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    firmId: integer('firm_id')
      .notNull()
      .references(() => firms.id),
    email: text('email').notNull(),
    name: text('name').notNull(),
    passwordHash: text('password_hash').notNull(),
    mustChangePassword: integer('must_change_password', { mode: 'boolean' }).notNull().default(true),
    disabled: integer('disabled', { mode: 'boolean' }).notNull().default(false),
    createdAt: text('created_at').notNull().default(now),
    passwordChangedAt: text('password_changed_at'),
  },
  (t) => [uniqueIndex('users_email_unique').on(t.email), index('users_firm_idx').on(t.firmId)],
);

export const userRoles = sqliteTable(
  'user_roles',
  {
    userId: integer('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    role: text('role', { enum: ROLES }).notNull(),
  },
  (t) => [primaryKey({ columns: [t.userId, t.role] })],
);

/** Signed-in sessions; the token carries the session id so sign-out can revoke it. */
export const sessions = sqliteTable(
  'sessions',
  {
    id: text('id').primaryKey(),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    createdAt: text('created_at').notNull().default(now),
    expiresAt: text('expires_at').notNull(),
    revokedAt: text('revoked_at'),
  },
  (t) => [index('sessions_user_idx').on(t.userId)],
);

export const projects = sqliteTable(
  'projects',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    firmId: integer('firm_id')
      .notNull()
      .references(() => firms.id),
    name: text('name').notNull(),
    ownerAgency: text('owner_agency').notNull().default(''),
    location: text('location').notNull().default(''),
    units: text('units', { enum: ['US', 'SI'] }).notNull().default('US'),
    notes: text('notes').notNull().default(''),
    archived: integer('archived', { mode: 'boolean' }).notNull().default(false),
    createdBy: integer('created_by')
      .notNull()
      .references(() => users.id),
    createdAt: text('created_at').notNull().default(now),
    updatedAt: text('updated_at').notNull().default(now),
  },
  (t) => [index('projects_firm_idx').on(t.firmId)],
);

/** A saved deck configuration; its content lives in immutable versions. */
export const decks = sqliteTable(
  'decks',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    projectId: integer('project_id')
      .notNull()
      .references(() => projects.id),
    name: text('name').notNull(),
    createdBy: integer('created_by')
      .notNull()
      .references(() => users.id),
    createdAt: text('created_at').notNull().default(now),
  },
  (t) => [index('decks_project_idx').on(t.projectId)],
);

/** Every save of a deck: never updated, never deleted. The highest number is current. */
export const deckVersions = sqliteTable(
  'deck_versions',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    deckId: integer('deck_id')
      .notNull()
      .references(() => decks.id),
    number: integer('number').notNull(),
    /** The deck (shared/deck/schema.ts DeckInput, internal SI units) as JSON. */
    deckJson: text('deck_json').notNull(),
    /** Saved lane and wheel placements as JSON, or null. */
    placementsJson: text('placements_json'),
    message: text('message').notNull(),
    basedOnVersionId: integer('based_on_version_id'),
    createdBy: integer('created_by')
      .notNull()
      .references(() => users.id),
    createdAt: text('created_at').notNull().default(now),
  },
  (t) => [uniqueIndex('deck_versions_deck_number_unique').on(t.deckId, t.number)],
);

/** Computed results per deck version and method, with the solver version that made them. */
export const analysisResults = sqliteTable(
  'analysis_results',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    versionId: integer('version_id')
      .notNull()
      .references(() => deckVersions.id),
    method: text('method').notNull(),
    solverVersion: text('solver_version').notNull(),
    dataJson: text('data_json').notNull(),
    createdAt: text('created_at').notNull().default(now),
  },
  (t) => [uniqueIndex('analysis_results_version_method_unique').on(t.versionId, t.method, t.solverVersion)],
);

/** Who did what, when. Append-only. */
export const auditLog = sqliteTable(
  'audit_log',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    firmId: integer('firm_id')
      .notNull()
      .references(() => firms.id),
    projectId: integer('project_id'),
    actorId: integer('actor_id').references(() => users.id),
    action: text('action').notNull(),
    entityType: text('entity_type').notNull(),
    entityId: integer('entity_id'),
    summary: text('summary').notNull(),
    at: text('at').notNull().default(now),
  },
  (t) => [index('audit_firm_project_idx').on(t.firmId, t.projectId)],
);

export type UserRow = typeof users.$inferSelect;
export type ProjectRow = typeof projects.$inferSelect;
export type DeckRow = typeof decks.$inferSelect;
export type DeckVersionRow = typeof deckVersions.$inferSelect;
export type AuditRow = typeof auditLog.$inferSelect;
