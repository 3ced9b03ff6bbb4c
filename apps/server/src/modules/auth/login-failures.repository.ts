import { and, count, eq, gte, lt } from 'drizzle-orm';
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

export function recordFailures(db: DbOrTx, keys: string[], at: Date): void {
  db.insert(loginFailures)
    .values(keys.map((key) => ({ key, at })))
    .run();
}

export function clearFailures(db: DbOrTx, key: string): void {
  db.delete(loginFailures).where(eq(loginFailures.key, key)).run();
}

export function pruneFailures(db: DbOrTx, before: Date): void {
  db.delete(loginFailures).where(lt(loginFailures.at, before)).run();
}
