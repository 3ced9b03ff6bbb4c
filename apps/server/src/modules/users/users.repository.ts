import { and, asc, count, desc, eq, gt, inArray, isNull, sql } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { organisations, sessions, users } from '../../db/schema';

export type UserRow = typeof users.$inferSelect;
export type NewUserRow = typeof users.$inferInsert;

export interface UserWithOrganisation extends UserRow {
  organisationName: string;
  organisationKind: 'home' | 'customer';
}

const withOrganisation = {
  id: users.id,
  email: users.email,
  name: users.name,
  role: users.role,
  organisationId: users.organisationId,
  passwordHash: users.passwordHash,
  disabledAt: users.disabledAt,
  lastSignInAt: users.lastSignInAt,
  passwordChangedAt: users.passwordChangedAt,
  createdAt: users.createdAt,
  authorisation: users.authorisation,
  qualification: users.qualification,
  organisationName: organisations.name,
  organisationKind: organisations.kind,
};

const preparedFindUser = new WeakMap<
  object,
  { get(values: { id: string }): UserWithOrganisation | undefined }
>();

/** Looked up on every signed-in request, so the statement is prepared once per connection. */
export function findUserById(db: DbOrTx, id: string): UserWithOrganisation | undefined {
  let statement = preparedFindUser.get(db);
  if (!statement) {
    statement = db
      .select(withOrganisation)
      .from(users)
      .innerJoin(organisations, eq(organisations.id, users.organisationId))
      .where(eq(users.id, sql.placeholder('id')))
      .prepare();
    preparedFindUser.set(db, statement);
  }
  return statement.get({ id });
}

export function findUserByEmail(db: DbOrTx, email: string): UserWithOrganisation | undefined {
  return db
    .select(withOrganisation)
    .from(users)
    .innerJoin(organisations, eq(organisations.id, users.organisationId))
    .where(eq(users.email, email))
    .get();
}

/** One page of users, the home organisation's first, by name; or the one user of `id`. */
export function listUsersWithSessionCounts(
  db: DbOrTx,
  now: Date,
  which: { limit: number; offset: number } | { id: string },
): (UserWithOrganisation & { activeSessions: number })[] {
  const live = db
    .select({ userId: sessions.userId, active: count().as('active') })
    .from(sessions)
    .where(and(isNull(sessions.revokedAt), gt(sessions.expiresAt, now)))
    .groupBy(sessions.userId)
    .as('live');
  return db
    .select({ ...withOrganisation, activeSessions: sql<number>`coalesce(${live.active}, 0)` })
    .from(users)
    .innerJoin(organisations, eq(organisations.id, users.organisationId))
    .leftJoin(live, eq(live.userId, users.id))
    .where('id' in which ? eq(users.id, which.id) : undefined)
    .orderBy(desc(organisations.kind), asc(users.name), asc(users.id))
    .limit('id' in which ? 1 : which.limit)
    .offset('id' in which ? 0 : which.offset)
    .all();
}

export function insertUser(db: DbOrTx, row: NewUserRow): void {
  db.insert(users).values(row).run();
}

export function updateUser(db: DbOrTx, id: string, changes: Partial<NewUserRow>): void {
  db.update(users).set(changes).where(eq(users.id, id)).run();
}

/** Whether any of these accounts exists (the demo scenario's, for one). */
export function anyUserWithId(db: DbOrTx, ids: string[]): boolean {
  return (
    db.select({ id: users.id }).from(users).where(inArray(users.id, ids)).limit(1).get() !==
    undefined
  );
}

export function countUsers(db: DbOrTx): number {
  return db.select({ n: count() }).from(users).get()?.n ?? 0;
}

/** Active users of the home organisation holding one of `roles`, who can sign in. */
export function listActiveHomeUsers(
  db: DbOrTx,
  roles: readonly UserRow['role'][],
): { id: string; email: string; name: string }[] {
  return db
    .select({ id: users.id, email: users.email, name: users.name })
    .from(users)
    .innerJoin(organisations, eq(organisations.id, users.organisationId))
    .where(
      and(
        eq(organisations.kind, 'home'),
        inArray(users.role, [...roles]),
        isNull(users.disabledAt),
        sql`${users.passwordHash} IS NOT NULL`,
      ),
    )
    .orderBy(asc(users.name))
    .all();
}
