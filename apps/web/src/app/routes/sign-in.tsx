import { Navigate, useLocation, useNavigate } from 'react-router-dom';
import { LoadingLine } from '../../components/ui/page';
import { useCurrentUser } from '../../features/auth/api/auth';
import { AuthCard } from '../../features/auth/components/auth-card';
import { LoginForm } from '../../features/auth/components/login-form';

export function SignInRoute() {
  const { data: user, isPending } = useCurrentUser();
  const navigate = useNavigate();
  const location = useLocation();
  const from = (location.state as { from?: string } | null)?.from ?? '/';
  if (isPending) return <LoadingLine />;
  if (user) return <Navigate to={from} replace />;
  return (
    <AuthCard title="Sign in">
      <LoginForm onSignedIn={() => navigate(from, { replace: true })} />
    </AuthCard>
  );
}
