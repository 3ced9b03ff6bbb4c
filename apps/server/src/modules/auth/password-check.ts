import type { AppContext, RequestMeta } from '../../context';
import { inTransaction } from '../../db/client';
import { AppError } from '../../http/app-error';
import type { Principal } from '../../http/principal';
import { findUserById } from '../users/users.repository';
import { countFailuresSince, pruneFailures, recordFailures } from './login-failures.repository';
import { verifyPassword } from './passwords';

type Limits = Pick<AppContext, 'db' | 'config' | 'logger' | 'now'>;

/** The keys a failed password check counts under: the account and the address it came from. */
export const failureKeys = (email: string, ip: string) => [`account:${email}`, `ip:${ip}`];

/**
 * Refuses (429) once an account or an address has met its limit of failed password checks in the
 * window. Sign-in and every signature share the count, so that guesses cannot move from one to
 * the other. Checked before bcrypt: bcryptjs is pure JavaScript, and a flood must not reach it.
 */
export function assertNotThrottled(ctx: Limits, email: string, meta: RequestMeta): void {
  const { db, config, logger } = ctx;
  const since = new Date(ctx.now().getTime() - config.loginWindowMs);
  const accountFailures = countFailuresSince(db, `account:${email}`, since);
  const ipFailures = countFailuresSince(db, `ip:${meta.ip}`, since);
  if (accountFailures >= config.loginMaxFailures || ipFailures >= config.loginMaxFailuresPerIp) {
    logger.warn(
      { email, ip: meta.ip, requestId: meta.requestId, at: ctx.now().toISOString() },
      'password checks throttled',
    );
    const minutes = Math.round(config.loginWindowMs / 60_000);
    throw new AppError(
      429,
      'too_many_attempts',
      `Too many wrong passwords. Wait ${minutes} minutes and try again, or reset your password.`,
      undefined,
      { 'Retry-After': String(Math.round(config.loginWindowMs / 1000)) },
    );
  }
}

/** Counts one failed password check against the account and the address. */
export function countFailure(ctx: Limits, email: string, meta: RequestMeta): void {
  const now = ctx.now();
  inTransaction(ctx.db, (tx) => {
    pruneFailures(tx, new Date(now.getTime() - ctx.config.loginWindowMs));
    recordFailures(tx, failureKeys(email, meta.ip), now);
  });
}

/**
 * The signed-in user's password asked again before a signature (DESIGN §5.5): a wrong one answers
 * 422 on the password field and counts towards the account's sign-in limit; past the limit, 429.
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
  assertNotThrottled(ctx, email, meta);
  if (await verifyPassword(password, user?.passwordHash ?? null)) return;
  countFailure(ctx, email, meta);
  ctx.logger.warn(
    { userId: principal.user.id, ip: meta.ip, requestId: meta.requestId },
    'password check failed',
  );
  throw AppError.unprocessable(`That is not your password: ${purpose}`, {
    fields: { password: ['Not your password'] },
    form: [],
  });
}
