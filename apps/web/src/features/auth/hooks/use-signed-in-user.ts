import { createContext, useContext } from 'react';
import type { SessionUser } from '@emberline/contracts/auth';

export const SignedInUserContext = createContext<SessionUser | null>(null);

/** The signed-in user, inside RequireAuth. */
export function useSignedInUser(): SessionUser {
  const user = useContext(SignedInUserContext);
  if (!user) throw new Error('useSignedInUser is used outside RequireAuth');
  return user;
}
