import { sql } from 'drizzle-orm';
import { index, integer, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';

const createdAt = () =>
  integer({ mode: 'timestamp_ms' })
    .notNull()
    .default(sql`(unixepoch('subsec') * 1000)`);

/** The home organisation (the one that inspects) and the customer organisations. */
export const organisations = sqliteTable('organisations', {
  id: text().primaryKey(),
  name: text().notNull().unique(),
  kind: text({ enum: ['home', 'customer'] }).notNull(),
  createdAt: createdAt(),
});

export const users = sqliteTable(
  'users',
  {
    id: text().primaryKey(),
    email: text().notNull().unique(),
    name: text().notNull(),
    role: text({ enum: ['admin', 'inspector', 'engineer', 'planner', 'customer'] }).notNull(),
    organisationId: text()
      .notNull()
      .references(() => organisations.id),
    /** Null until an invited user chooses a password. */
    passwordHash: text(),
    disabledAt: integer({ mode: 'timestamp_ms' }),
    lastSignInAt: integer({ mode: 'timestamp_ms' }),
    passwordChangedAt: integer({ mode: 'timestamp_ms' }),
    createdAt: createdAt(),
  },
  (table) => [index('users_organisation_idx').on(table.organisationId)],
);

/** Server-side session rows: the signed cookie is only valid while its row is live. */
export const sessions = sqliteTable(
  'sessions',
  {
    id: text().primaryKey(),
    userId: text()
      .notNull()
      .references(() => users.id),
    createdAt: createdAt(),
    lastSeenAt: integer({ mode: 'timestamp_ms' }).notNull(),
    expiresAt: integer({ mode: 'timestamp_ms' }).notNull(),
    revokedAt: integer({ mode: 'timestamp_ms' }),
    revokedReason: text(),
    ip: text(),
    userAgent: text(),
  },
  (table) => [index('sessions_user_idx').on(table.userId, table.revokedAt)],
);

/** Failed sign-ins, kept in SQLite so the rate limit survives a restart. */
export const loginFailures = sqliteTable(
  'login_failures',
  {
    id: integer().primaryKey({ autoIncrement: true }),
    key: text().notNull(),
    at: integer({ mode: 'timestamp_ms' }).notNull(),
  },
  (table) => [index('login_failures_key_at_idx').on(table.key, table.at)],
);

/** Single-use links sent by e-mail: invitations and password resets. Only the hash is stored. */
export const userTokens = sqliteTable(
  'user_tokens',
  {
    id: text().primaryKey(),
    userId: text()
      .notNull()
      .references(() => users.id),
    purpose: text({ enum: ['invitation', 'password-reset'] }).notNull(),
    tokenHash: text().notNull(),
    createdAt: createdAt(),
    expiresAt: integer({ mode: 'timestamp_ms' }).notNull(),
    usedAt: integer({ mode: 'timestamp_ms' }),
  },
  (table) => [
    uniqueIndex('user_tokens_hash_idx').on(table.tokenHash),
    index('user_tokens_user_idx').on(table.userId, table.purpose),
  ],
);

/** Append-only: SQLite triggers refuse UPDATE and DELETE (see the custom migration). */
export const auditLog = sqliteTable(
  'audit_log',
  {
    id: integer().primaryKey({ autoIncrement: true }),
    at: integer({ mode: 'timestamp_ms' }).notNull(),
    actorUserId: text().references(() => users.id),
    action: text().notNull(),
    entityType: text().notNull(),
    entityId: text(),
    before: text({ mode: 'json' }),
    after: text({ mode: 'json' }),
    requestId: text(),
    ip: text(),
  },
  (table) => [
    index('audit_log_entity_idx').on(table.entityType, table.entityId),
    index('audit_log_at_idx').on(table.at),
  ],
);
