import type { DbOrTx } from '../../db/client';
import { AppError } from '../../http/app-error';
import { newId, newSecretToken, sha256Hex } from '../../lib/ids';
import {
  expireUserTokens,
  findUserTokenByHash,
  insertUserToken,
  markUserTokenUsed,
  type TokenPurpose,
  type UserTokenRow,
} from './user-tokens.repository';

export const tokenLifetimes: Record<TokenPurpose, number> = {
  invitation: 7 * 24 * 3_600_000,
  'password-reset': 60 * 60_000,
};

const expiredMessages: Record<TokenPurpose, string> = {
  invitation:
    'This invitation link has expired or was already used. Ask your administrator to send a new one.',
  'password-reset':
    'This reset link has expired or was already used. Ask for a new one from the sign-in page.',
};

/** Issues a new single-use link secret; earlier unused links of the same purpose stop working. */
export function issueUserToken(
  db: DbOrTx,
  userId: string,
  purpose: TokenPurpose,
  now: Date,
): string {
  expireUserTokens(db, userId, purpose, now);
  const token = newSecretToken();
  insertUserToken(db, {
    id: newId(),
    userId,
    purpose,
    tokenHash: sha256Hex(token),
    createdAt: now,
    expiresAt: new Date(now.getTime() + tokenLifetimes[purpose]),
  });
  return token;
}

/** The live token row for a secret, or a 410-style refusal a user understands. */
export function findLiveToken(
  db: DbOrTx,
  token: string,
  purpose: TokenPurpose,
  now: Date,
): UserTokenRow {
  const row = findUserTokenByHash(db, sha256Hex(token));
  if (!row || row.purpose !== purpose || row.usedAt || row.expiresAt <= now) {
    throw new AppError(410, 'link_expired', expiredMessages[purpose]);
  }
  return row;
}

/** Uses a token once; a second use (a replay or a race) is refused. */
export function consumeToken(db: DbOrTx, row: UserTokenRow, now: Date): void {
  if (!markUserTokenUsed(db, row.id, now)) {
    throw new AppError(410, 'link_expired', expiredMessages[row.purpose]);
  }
}
