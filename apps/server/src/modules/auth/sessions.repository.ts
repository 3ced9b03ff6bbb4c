import { and, eq, gte, isNull, ne, sql } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { sessions } from '../../db/schema';

export type SessionRow = typeof sessions.$inferSelect;

export function insertSession(db: DbOrTx, row: typeof sessions.$inferInsert): void {
  db.insert(sessions).values(row).run();
}

const preparedFindSession = new WeakMap<
  object,
  { get(values: { id: string }): SessionRow | undefined }
>();

/** Looked up on every signed-in request, so the statement is prepared once per connection. */
export function findSession(db: DbOrTx, id: string): SessionRow | undefined {
  let statement = preparedFindSession.get(db);
  if (!statement) {
    statement = db
      .select()
      .from(sessions)
      .where(eq(sessions.id, sql.placeholder('id')))
      .prepare();
    preparedFindSession.set(db, statement);
  }
  return statement.get({ id });
}

export function touchSession(db: DbOrTx, id: string, at: Date): void {
  db.update(sessions).set({ lastSeenAt: at }).where(eq(sessions.id, id)).run();
}

export function revokeSession(db: DbOrTx, id: string, at: Date, reason: string): void {
  db.update(sessions)
    .set({ revokedAt: at, revokedReason: reason })
    .where(and(eq(sessions.id, id), isNull(sessions.revokedAt)))
    .run();
}

/** Revokes every live session of a user, except `keepSessionId` when given. Returns how many. */
export function revokeUserSessions(
  db: DbOrTx,
  userId: string,
  at: Date,
  reason: string,
  keepSessionId?: string,
): number {
  const conditions = [eq(sessions.userId, userId), isNull(sessions.revokedAt)];
  if (keepSessionId) conditions.push(ne(sessions.id, keepSessionId));
  return db
    .update(sessions)
    .set({ revokedAt: at, revokedReason: reason })
    .where(and(...conditions))
    .run().changes;
}

/** Whether the user has opened a session from this address since `since`. */
export function hasSignedInFrom(db: DbOrTx, userId: string, ip: string, since: Date): boolean {
  return Boolean(
    db
      .select({ id: sessions.id })
      .from(sessions)
      .where(and(eq(sessions.userId, userId), eq(sessions.ip, ip), gte(sessions.createdAt, since)))
      .get(),
  );
}
