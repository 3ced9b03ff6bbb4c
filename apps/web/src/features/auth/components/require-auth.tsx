import type { ReactNode } from 'react';
import { Navigate, useLocation } from 'react-router-dom';
import { LoadingLine } from '../../../components/ui/page';
import { Notice } from '../../../components/ui/notice';
import { useCurrentUser } from '../api/auth';
import { SignedInUserContext } from '../hooks/use-signed-in-user';

/** Renders its children for a signed-in user and sends everyone else to the sign-in page. */
export function RequireAuth({ children }: { children: ReactNode }) {
  const { data: user, isPending, error } = useCurrentUser();
  const location = useLocation();
  if (isPending)
    return (
      <div className="p-8">
        <LoadingLine />
      </div>
    );
  if (error)
    return (
      <div className="p-8">
        <Notice tone="error">{error.message}</Notice>
      </div>
    );
  if (!user)
    return <Navigate to="/sign-in" replace state={{ from: location.pathname + location.search }} />;
  return <SignedInUserContext.Provider value={user}>{children}</SignedInUserContext.Provider>;
}
