import { and, eq, isNull } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { userTokens } from '../../db/schema';

export type UserTokenRow = typeof userTokens.$inferSelect;
export type TokenPurpose = UserTokenRow['purpose'];

export function insertUserToken(db: DbOrTx, row: typeof userTokens.$inferInsert): void {
  db.insert(userTokens).values(row).run();
}

export function findUserTokenByHash(db: DbOrTx, tokenHash: string): UserTokenRow | undefined {
  return db.select().from(userTokens).where(eq(userTokens.tokenHash, tokenHash)).get();
}

/** Marks a token used; false when it was already used (a replay, or a race between two tabs). */
export function markUserTokenUsed(db: DbOrTx, id: string, at: Date): boolean {
  return (
    db
      .update(userTokens)
      .set({ usedAt: at })
      .where(and(eq(userTokens.id, id), isNull(userTokens.usedAt)))
      .run().changes === 1
  );
}

/** Ends every unused token of a purpose for a user, so only the newest link works. */
export function expireUserTokens(
  db: DbOrTx,
  userId: string,
  purpose: TokenPurpose,
  at: Date,
): void {
  db.update(userTokens)
    .set({ usedAt: at })
    .where(
      and(
        eq(userTokens.userId, userId),
        eq(userTokens.purpose, purpose),
        isNull(userTokens.usedAt),
      ),
    )
    .run();
}
