import type {
  AcceptInvitationInput,
  ChangePasswordInput,
  InvitationInfo,
  LoginInput,
  PasswordResetConfirm,
  SessionUser,
} from '@emberline/contracts/auth';
import type { AppContext, RequestMeta } from '../../context';
import { inTransaction } from '../../db/client';
import { AppError } from '../../http/app-error';
import type { Principal } from '../../http/principal';
import { queueMail } from '../../lib/email/outbox';
import { newId } from '../../lib/ids';
import { appendAudit } from '../audit/audit.repository';
import {
  findUserByEmail,
  findUserById,
  updateUser,
  type UserWithOrganisation,
} from '../users/users.repository';
import { toSessionUser } from '../users/user-view';
import { passwordResetEmail } from './auth-emails';
import {
  clearFailures,
  clearFailuresStartingWith,
  countFailuresSince,
  recordFailures,
} from './login-failures.repository';
import { beginPasswordCheck, failureKeys } from './password-check';
import { hashPassword, verifyPassword } from './passwords';
import { signSessionToken, verifySessionToken } from './session-token';
import {
  findSession,
  insertSession,
  revokeSession,
  revokeUserSessions,
  touchSession,
} from './sessions.repository';
import { consumeToken, findLiveToken, issueUserToken } from './user-tokens.service';

/** A new session: the signed token for the cookie, and when it ends at the latest. */
export interface IssuedSession {
  user: SessionUser;
  token: string;
  expiresAt: Date;
}

// lastSeenAt is written at most this often, so that reads do not each turn into a write.
const TOUCH_INTERVAL_MS = 60_000;
const RESET_REQUESTS_PER_HOUR = 5;

export function createAuthService(ctx: AppContext) {
  const { db, config, logger } = ctx;

  async function openSession(
    user: UserWithOrganisation,
    meta: RequestMeta,
    action: string,
  ): Promise<IssuedSession> {
    const now = ctx.now();
    const sessionId = newId();
    const expiresAt = new Date(now.getTime() + config.sessionAbsoluteMs);
    inTransaction(db, (tx) => {
      insertSession(tx, {
        id: sessionId,
        userId: user.id,
        createdAt: now,
        lastSeenAt: now,
        expiresAt,
        ip: meta.ip,
        userAgent: meta.userAgent,
      });
      updateUser(tx, user.id, { lastSignInAt: now });
      appendAudit(tx, now, {
        actorUserId: user.id,
        action,
        entityType: 'session',
        entityId: sessionId,
        after: { userId: user.id, expiresAt: expiresAt.toISOString() },
        requestId: meta.requestId,
        ip: meta.ip,
      });
    });
    const token = await signSessionToken(ctx.sessionKey, { userId: user.id, sessionId }, expiresAt);
    return { user: toSessionUser(user), token, expiresAt };
  }

  return {
    async login(input: LoginInput, meta: RequestMeta): Promise<IssuedSession> {
      // Limited and counted before bcrypt: bcryptjs is pure JavaScript, and a flood must not
      // reach it, nor parallel guesses slip past the count.
      const attempt = beginPasswordCheck(ctx, input.email, meta);
      const user = findUserByEmail(db, input.email);
      const passwordMatches = await verifyPassword(
        input.password,
        user?.passwordHash ?? null,
        config.bcryptCost,
      );
      if (!user || !passwordMatches || user.disabledAt) {
        const now = ctx.now();
        logger.warn(
          {
            email: input.email,
            userId: user?.id ?? null,
            ip: meta.ip,
            requestId: meta.requestId,
            at: now.toISOString(),
            reason: !user ? 'unknown-account' : user.disabledAt ? 'disabled' : 'wrong-password',
          },
          'sign-in failed',
        );
        throw AppError.unauthenticated('The e-mail address or the password is not right');
      }
      attempt.succeeded();
      const session = await openSession(user, meta, 'auth.sign-in');
      logger.info(
        {
          userId: user.id,
          email: user.email,
          ip: meta.ip,
          requestId: meta.requestId,
          at: ctx.now().toISOString(),
        },
        'sign-in',
      );
      return session;
    },

    /** The principal a session cookie stands for, or null when it is not (or no longer) valid. */
    async resolveSession(token: string): Promise<Principal | null> {
      const now = ctx.now();
      const claims = await verifySessionToken(ctx.sessionKey, token, now);
      if (!claims) return null;
      const session = findSession(db, claims.sessionId);
      if (!session || session.userId !== claims.userId || session.revokedAt) return null;
      if (session.expiresAt <= now) return null;
      if (now.getTime() - session.lastSeenAt.getTime() > config.sessionIdleMs) {
        revokeSession(db, session.id, now, 'idle');
        return null;
      }
      const user = findUserById(db, session.userId);
      if (!user || user.disabledAt || !user.passwordHash) return null;
      if (now.getTime() - session.lastSeenAt.getTime() > TOUCH_INTERVAL_MS)
        touchSession(db, session.id, now);
      return { user: toSessionUser(user), sessionId: session.id };
    },

    logout(principal: Principal, meta: RequestMeta): void {
      const now = ctx.now();
      inTransaction(db, (tx) => {
        revokeSession(tx, principal.sessionId, now, 'sign-out');
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'auth.sign-out',
          entityType: 'session',
          entityId: principal.sessionId,
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
    },

    /** Changes the password; every session of the user ends and the caller gets a new one. */
    async changePassword(
      principal: Principal,
      input: ChangePasswordInput,
      meta: RequestMeta,
    ): Promise<IssuedSession> {
      const user = findUserById(db, principal.user.id);
      if (!user) throw AppError.unauthenticated();
      const attempt = beginPasswordCheck(ctx, user.email, meta);
      if (!(await verifyPassword(input.currentPassword, user.passwordHash, config.bcryptCost))) {
        throw new AppError(422, 'wrong_password', 'The current password is not right', {
          fields: { currentPassword: ['The current password is not right'] },
          form: [],
        });
      }
      attempt.succeeded();
      const passwordHash = await hashPassword(input.newPassword, config.bcryptCost);
      const now = ctx.now();
      inTransaction(db, (tx) => {
        updateUser(tx, user.id, { passwordHash, passwordChangedAt: now });
        revokeUserSessions(tx, user.id, now, 'password-changed');
        appendAudit(tx, now, {
          actorUserId: user.id,
          action: 'user.password-changed',
          entityType: 'user',
          entityId: user.id,
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
      return openSession({ ...user, passwordHash }, meta, 'auth.sign-in');
    },

    /**
     * Queues a reset link when the address belongs to an active account; says nothing either way.
     * The route answers before this runs, so the answer does not tell whether the address has
     * an account; a request for no account is kept in the audit log. The outbox delivers the
     * e-mail; nothing waits for SMTP.
     */
    requestPasswordReset(email: string, meta: RequestMeta): void {
      const now = ctx.now();
      const key = `reset:${email}`;
      if (
        countFailuresSince(db, key, new Date(now.getTime() - 3_600_000)) >= RESET_REQUESTS_PER_HOUR
      ) {
        logger.warn({ email, ip: meta.ip, requestId: meta.requestId }, 'password reset throttled');
        return;
      }
      recordFailures(db, [key], now);
      const user = findUserByEmail(db, email);
      if (!user || user.disabledAt || !user.passwordHash) {
        inTransaction(db, (tx) =>
          appendAudit(tx, now, {
            actorUserId: null,
            action: 'user.password-reset-for-no-account',
            entityType: 'user',
            entityId: user?.id ?? null,
            after: { email },
            requestId: meta.requestId,
            ip: meta.ip,
          }),
        );
        return;
      }
      inTransaction(db, (tx) => {
        const secret = issueUserToken(tx, user.id, 'password-reset', now);
        appendAudit(tx, now, {
          actorUserId: null,
          action: 'user.password-reset-requested',
          entityType: 'user',
          entityId: user.id,
          requestId: meta.requestId,
          ip: meta.ip,
        });
        const link = `${publicOrigin(config.publicOrigins, config.port)}/reset-password#token=${secret}`;
        queueMail(ctx, tx, {
          kind: 'password-reset',
          ...passwordResetEmail({ to: user.email, name: user.name, link }),
          record: { type: 'user', id: user.id, label: `Password reset of ${user.name}` },
        });
      });
    },

    async confirmPasswordReset(input: PasswordResetConfirm, meta: RequestMeta): Promise<void> {
      const now = ctx.now();
      const row = findLiveToken(db, input.token, 'password-reset', now);
      const passwordHash = await hashPassword(input.password, config.bcryptCost);
      inTransaction(db, (tx) => {
        consumeToken(tx, row, now);
        updateUser(tx, row.userId, { passwordHash, passwordChangedAt: now });
        revokeUserSessions(tx, row.userId, now, 'password-reset');
        // A new password ends the guessing of the old one: the account starts afresh everywhere.
        const email = findUserById(tx, row.userId)?.email ?? '';
        clearFailures(tx, failureKeys(email, '').account);
        clearFailuresStartingWith(tx, failureKeys(email, '').pair);
        appendAudit(tx, now, {
          actorUserId: row.userId,
          action: 'user.password-reset',
          entityType: 'user',
          entityId: row.userId,
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
    },

    inspectInvitation(token: string): InvitationInfo {
      const row = findLiveToken(db, token, 'invitation', ctx.now());
      const user = findUserById(db, row.userId);
      if (!user || user.disabledAt)
        throw new AppError(410, 'link_expired', 'This invitation is no longer valid.');
      return {
        email: user.email,
        name: user.name,
        organisationName: user.organisationName,
        role: user.role,
      };
    },

    /** Accepts an invitation: the user chooses a password and is signed in. */
    async acceptInvitation(
      input: AcceptInvitationInput,
      meta: RequestMeta,
    ): Promise<IssuedSession> {
      const now = ctx.now();
      const row = findLiveToken(db, input.token, 'invitation', now);
      const user = findUserById(db, row.userId);
      if (!user || user.disabledAt)
        throw new AppError(410, 'link_expired', 'This invitation is no longer valid.');
      const passwordHash = await hashPassword(input.password, config.bcryptCost);
      inTransaction(db, (tx) => {
        consumeToken(tx, row, now);
        updateUser(tx, user.id, { passwordHash, name: input.name, passwordChangedAt: now });
        appendAudit(tx, now, {
          actorUserId: user.id,
          action: 'user.invitation-accepted',
          entityType: 'user',
          entityId: user.id,
          before: { name: user.name },
          after: { name: input.name },
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
      return openSession({ ...user, name: input.name, passwordHash }, meta, 'auth.sign-in');
    },
  };
}

export type AuthService = ReturnType<typeof createAuthService>;

/** The address people reach the product at, for links in e-mails. */
export function publicOrigin(configured: readonly string[], port: number): string {
  return configured[0] ?? `http://localhost:${port}`;
}
