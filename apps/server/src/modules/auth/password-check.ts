import type { AppContext, RequestMeta } from '../../context';
import { inTransaction } from '../../db/client';
import { AppError } from '../../http/app-error';
import type { Principal } from '../../http/principal';
import { findUserByEmail, findUserById } from '../users/users.repository';
import {
  clearFailures,
  countFailuresSince,
  deleteFailures,
  failureSince,
  latestFailure,
  pruneFailures,
  recordFailures,
} from './login-failures.repository';
import { verifyPassword } from './passwords';
import { hasSignedInFrom } from './sessions.repository';

type Limits = Pick<AppContext, 'db' | 'config' | 'logger' | 'now'>;

// An address the account signed in from within this many days is its owner's usual address.
const USUAL_ADDRESS_DAYS = 90;
const DAY_MS = 86_400_000;

/**
 * The keys a password check counts under (docs/decisions/009-password-guessing.md): the account
 * and address pair, the address across accounts, and the account across addresses.
 */
export const failureKeys = (email: string, ip: string) => ({
  pair: `pair:${email}|${ip}`,
  address: `ip:${ip}`,
  account: `account:${email}`,
});

/** One password check under way; its counts are taken before bcrypt runs. */
export interface PasswordAttempt {
  /** The password was right: the attempt is not counted, and the pair's count starts again. */
  succeeded(): void;
}

function tooMany(seconds: number, message: string): AppError {
  return new AppError(429, 'too_many_attempts', message, undefined, {
    'Retry-After': String(Math.max(1, Math.ceil(seconds))),
  });
}

function waitWords(seconds: number): string {
  return seconds < 90
    ? `${Math.max(1, Math.ceil(seconds))} seconds`
    : `${Math.ceil(seconds / 60)} minutes`;
}

/** Whether the account has signed in from this address lately. */
function isUsualAddress(ctx: Limits, email: string, ip: string): boolean {
  const user = findUserByEmail(ctx.db, email);
  if (!user) return false;
  const since = new Date(ctx.now().getTime() - USUAL_ADDRESS_DAYS * DAY_MS);
  return hasSignedInFrom(ctx.db, user.id, ip, since);
}

/**
 * Starts a password check: refuses it (429) when a limit is met, and otherwise counts it as a
 * failure at once, before bcrypt, so that parallel guesses see each other (30 at once → at most
 * the pair's limit of checks). The caller settles it with `succeeded()` when the password is
 * right; a wrong one stays counted. Sign-in and every re-entered password (signatures,
 * publication, password change) share the counts, so that guesses cannot move between them.
 *
 * The limits: the pair and the address each have a count in a window (429 until it passes); the
 * account across addresses has a higher free count, past which each further attempt waits twice
 * as long after the last as the one before (up to the window), except from the owner's usual
 * addresses, so that guessing from everywhere slows to a few tries an hour and the owner still gets in.
 */
export function beginPasswordCheck(ctx: Limits, email: string, meta: RequestMeta): PasswordAttempt {
  const { db, config, logger } = ctx;
  const now = ctx.now().getTime();
  const keys = failureKeys(email, meta.ip);
  const since = new Date(now - config.loginWindowMs);
  const refuse = (error: AppError, limit: string) => {
    logger.warn(
      { email, ip: meta.ip, requestId: meta.requestId, at: ctx.now().toISOString(), limit },
      'password checks throttled',
    );
    return error;
  };
  const pairCount = countFailuresSince(db, keys.pair, since);
  const addressCount = countFailuresSince(db, keys.address, since);
  // Past a limit, the wait lasts until enough of the window's failures have aged out of it to
  // bring the count back under the limit.
  const waitFor = (key: string, count: number, limit: number): number => {
    if (count < limit) return 0;
    const freeing = failureSince(db, key, since, count - limit);
    return freeing ? (freeing.getTime() + config.loginWindowMs - now) / 1000 : 0;
  };
  const pairWait = waitFor(keys.pair, pairCount, config.loginMaxFailures);
  const addressWait = waitFor(keys.address, addressCount, config.loginMaxFailuresPerIp);
  if (pairWait > 0 || addressWait > 0) {
    const wait = Math.max(pairWait, addressWait);
    throw refuse(
      tooMany(
        wait,
        `Too many wrong passwords. Wait ${waitWords(wait)} and try again, or reset your password.`,
      ),
      pairWait >= addressWait ? 'pair' : 'address',
    );
  }
  const accountCount = countFailuresSince(
    db,
    keys.account,
    new Date(now - config.loginAccountWindowMs),
  );
  const beyond = accountCount - config.loginMaxFailuresPerAccount;
  if (beyond >= 0 && !isUsualAddress(ctx, email, meta.ip)) {
    const delayMs = Math.min(2 ** beyond * 1000, config.loginWindowMs);
    const last = latestFailure(db, keys.account)?.getTime() ?? 0;
    if (now - last < delayMs) {
      const seconds = (last + delayMs - now) / 1000;
      throw refuse(
        tooMany(
          seconds,
          `Too many wrong passwords for this account. Wait ${waitWords(seconds)} and try again, sign in from where you usually do, or reset your password.`,
        ),
        'account',
      );
    }
  }
  const ids = inTransaction(db, (tx) => {
    pruneFailures(tx, new Date(now - Math.max(config.loginWindowMs, config.loginAccountWindowMs)));
    return recordFailures(tx, [keys.pair, keys.address, keys.account], new Date(now));
  });
  return {
    succeeded() {
      inTransaction(db, (tx) => {
        deleteFailures(tx, ids);
        clearFailures(tx, keys.pair);
      });
    },
  };
}

/**
 * The signed-in user's password asked again before a signature (DESIGN §5.5): a wrong one answers
 * 422 on the password field and counts towards the sign-in limits; past a limit, 429.
 * `purpose` finishes the sentence "That is not your password: …".
 */
export async function confirmPassword(
  ctx: Limits,
  principal: Principal,
  password: string,
  meta: RequestMeta,
  purpose: string,
): Promise<void> {
  const user = findUserById(ctx.db, principal.user.id);
  const email = user?.email ?? principal.user.email;
  const attempt = beginPasswordCheck(ctx, email, meta);
  if (await verifyPassword(password, user?.passwordHash ?? null, ctx.config.bcryptCost)) {
    attempt.succeeded();
    return;
  }
  ctx.logger.warn(
    { userId: principal.user.id, ip: meta.ip, requestId: meta.requestId },
    'password check failed',
  );
  throw AppError.unprocessable(`That is not your password: ${purpose}`, {
    fields: { password: ['Not your password'] },
    form: [],
  });
}
