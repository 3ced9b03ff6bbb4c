import { and, asc, count, desc, eq, gte, inArray, lt, sql } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { loginFailures } from '../../db/schema';

export function countFailuresSince(db: DbOrTx, key: string, since: Date): number {
  return (
    db
      .select({ n: count() })
      .from(loginFailures)
      .where(and(eq(loginFailures.key, key), gte(loginFailures.at, since)))
      .get()?.n ?? 0
  );
}

/**
 * When the `skip`+1-th oldest failure of a key since a moment was counted: the one whose expiry
 * brings the count back under a limit of (count − skip).
 */
export function failureSince(db: DbOrTx, key: string, since: Date, skip: number): Date | undefined {
  return db
    .select({ at: loginFailures.at })
    .from(loginFailures)
    .where(and(eq(loginFailures.key, key), gte(loginFailures.at, since)))
    .orderBy(asc(loginFailures.at), asc(loginFailures.id))
    .limit(1)
    .offset(skip)
    .get()?.at;
}

/** When the latest failure of a key was counted, if any is kept. */
export function latestFailure(db: DbOrTx, key: string): Date | undefined {
  return db
    .select({ at: loginFailures.at })
    .from(loginFailures)
    .where(eq(loginFailures.key, key))
    .orderBy(desc(loginFailures.at))
    .limit(1)
    .get()?.at;
}

/** Counts a failure under each key; the ids of the rows, to take them back on success. */
export function recordFailures(db: DbOrTx, keys: string[], at: Date): number[] {
  return db
    .insert(loginFailures)
    .values(keys.map((key) => ({ key, at })))
    .returning({ id: loginFailures.id })
    .all()
    .map((row) => row.id);
}

export function deleteFailures(db: DbOrTx, ids: number[]): void {
  if (ids.length) db.delete(loginFailures).where(inArray(loginFailures.id, ids)).run();
}

export function clearFailures(db: DbOrTx, key: string): void {
  db.delete(loginFailures).where(eq(loginFailures.key, key)).run();
}

/** Clears every key that begins with `prefix` (compared as text, without LIKE's wildcards). */
export function clearFailuresStartingWith(db: DbOrTx, prefix: string): void {
  db.delete(loginFailures)
    .where(sql`substr(${loginFailures.key}, 1, ${prefix.length}) = ${prefix}`)
    .run();
}

export function pruneFailures(db: DbOrTx, before: Date): void {
  db.delete(loginFailures).where(lt(loginFailures.at, before)).run();
}
