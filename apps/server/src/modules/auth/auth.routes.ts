import { Router } from 'express';
import {
  acceptInvitationInputSchema,
  changePasswordInputSchema,
  invitationInfoSchema,
  loginInputSchema,
  meResponseSchema,
  passwordResetConfirmSchema,
  passwordResetAcceptedSchema,
  passwordResetRequestSchema,
  tokenSchema,
  type MeResponse,
} from '@emberline/contracts/auth';
import { z } from 'zod';
import type { AppContext } from '../../context';
import { optionalPrincipalOf, principalOf } from '../../http/principal';
import { requestMeta } from '../../http/request-meta';
import { route } from '../../http/route';
import type { AuthService } from './auth.service';
import { clearSessionCookie, setSessionCookie } from './session-cookie';

export function authRoutes(ctx: AppContext, auth: AuthService): Router {
  const router = Router();
  const signedIn = { response: meResponseSchema };

  route(
    router,
    'POST /auth/login',
    { summary: 'Sign in; sets the session cookie', body: loginInputSchema, ...signedIn },
    async (req, res) => {
      const session = await auth.login(res.locals.body, requestMeta(req));
      setSessionCookie(req, res, ctx.config, session.token, session.expiresAt);
      res.json({ user: session.user } satisfies MeResponse);
    },
  );

  route(
    router,
    'POST /auth/logout',
    { summary: 'Sign out; ends the session', status: 204 },
    (req, res) => {
      const principal = optionalPrincipalOf(res);
      if (principal) auth.logout(principal, requestMeta(req));
      clearSessionCookie(req, res, ctx.config);
      res.status(204).end();
    },
  );

  route(router, 'GET /auth/me', { summary: 'The signed-in user', ...signedIn }, (_req, res) => {
    res.json({ user: principalOf(res).user } satisfies MeResponse);
  });

  route(
    router,
    'POST /auth/password',
    {
      summary: 'Change the password; every other session ends',
      body: changePasswordInputSchema,
      ...signedIn,
    },
    async (req, res) => {
      const session = await auth.changePassword(
        principalOf(res),
        res.locals.body,
        requestMeta(req),
      );
      setSessionCookie(req, res, ctx.config, session.token, session.expiresAt);
      res.json({ user: session.user } satisfies MeResponse);
    },
  );

  route(
    router,
    'POST /auth/password-reset',
    {
      summary: 'E-mail a single-use reset link when the address has an active account',
      body: passwordResetRequestSchema,
      response: passwordResetAcceptedSchema,
      status: 202,
    },
    (req, res) => {
      const meta = requestMeta(req);
      const { email } = res.locals.body;
      // The answer leaves before the address is even looked up, so that it takes the same time
      // whether or not the address has an account; the link, if any, is queued once the answer
      // has been handed to the connection.
      res.once('finish', () => {
        try {
          auth.requestPasswordReset(email, meta);
        } catch (error) {
          req.log.error({ err: error, requestId: meta.requestId }, 'password reset request failed');
        }
      });
      res.status(202).json({ status: 'sent-if-known' });
    },
  );

  route(
    router,
    'POST /auth/password-reset/confirm',
    {
      summary: 'Choose a new password with a reset link',
      body: passwordResetConfirmSchema,
      status: 204,
    },
    async (req, res) => {
      await auth.confirmPasswordReset(res.locals.body, requestMeta(req));
      res.status(204).end();
    },
  );

  route(
    router,
    'POST /auth/invitations/inspect',
    {
      summary: 'Who an invitation link is for',
      body: z.strictObject({ token: tokenSchema }),
      response: invitationInfoSchema,
    },
    (_req, res) => {
      res.json(auth.inspectInvitation(res.locals.body.token));
    },
  );

  route(
    router,
    'POST /auth/invitations/accept',
    {
      summary: 'Accept an invitation: choose a password and sign in',
      body: acceptInvitationInputSchema,
      ...signedIn,
    },
    async (req, res) => {
      const session = await auth.acceptInvitation(res.locals.body, requestMeta(req));
      setSessionCookie(req, res, ctx.config, session.token, session.expiresAt);
      res.json({ user: session.user } satisfies MeResponse);
    },
  );

  return router;
}
