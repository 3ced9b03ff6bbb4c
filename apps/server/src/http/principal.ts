import type { Response } from 'express';
import type { SessionUser } from '@emberline/contracts/auth';
import { AppError } from './app-error';

/** Who is calling: the signed-in user and the session the cookie belongs to. */
export interface Principal {
  user: SessionUser;
  sessionId: string;
}

/** The caller of a route that requires sign-in; the route policy has already checked it. */
export function principalOf(res: Response): Principal {
  const principal = res.locals.principal as Principal | null | undefined;
  if (!principal) throw AppError.unauthenticated();
  return principal;
}

export function optionalPrincipalOf(res: Response): Principal | null {
  return (res.locals.principal as Principal | null | undefined) ?? null;
}
