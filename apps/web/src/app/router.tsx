import { createBrowserRouter, Navigate, RouterProvider } from 'react-router-dom';
import { RequireAuth } from '../features/auth/components/require-auth';
import { AcceptInvitationRoute } from './routes/accept-invitation';
import { AccountRoute } from './routes/account';
import { AdminLayout } from './routes/admin/admin-layout';
import { AdminAuditLogRoute } from './routes/admin/audit-log';
import { AdminOutboxRoute } from './routes/admin/outbox';
import { AdminUsersRoute } from './routes/admin/users';
import { AppShell } from './routes/app-shell';
import { ForgotPasswordRoute } from './routes/forgot-password';
import { NotBuiltYet } from './routes/not-built-yet';
import { NotFoundRoute } from './routes/not-found';
import { ResetPasswordRoute } from './routes/reset-password';
import { SignInRoute } from './routes/sign-in';

const router = createBrowserRouter([
  { path: '/sign-in', element: <SignInRoute /> },
  { path: '/forgot-password', element: <ForgotPasswordRoute /> },
  { path: '/reset-password', element: <ResetPasswordRoute /> },
  { path: '/accept-invitation', element: <AcceptInvitationRoute /> },
  {
    element: (
      <RequireAuth>
        <AppShell />
      </RequireAuth>
    ),
    children: [
      { index: true, element: <Navigate to="/fleet" replace /> },
      {
        path: 'fleet',
        element: (
          <NotBuiltYet
            title="Fleet"
            permission="read:engine"
            purpose="Engines with their models, owners, TSN and CSN, utilization and inspections."
          />
        ),
      },
      {
        path: 'review',
        element: (
          <NotBuiltYet
            title="Review queue"
            permission="review:inspection"
            purpose="Submitted inspections waiting for an engineer’s disposition and signature."
          />
        ),
      },
      {
        path: 'limits',
        element: (
          <NotBuiltYet
            title="Limit library"
            permission="read:limit-set"
            purpose="Damage-limit revisions per engine model, transcribed from the approved engine manual."
          />
        ),
      },
      {
        path: 'planning',
        element: (
          <NotBuiltYet
            title="Planning board"
            permission="read:planning"
            purpose="Re-inspections due from the dispositions, dated from each engine’s utilization."
          />
        ),
      },
      {
        path: 'reports',
        element: (
          <NotBuiltYet
            title="Reports"
            permission="read:report"
            purpose="Signed inspection reports, as e-mailed to the customer’s contacts."
          />
        ),
      },
      { path: 'account', element: <AccountRoute /> },
      {
        path: 'admin',
        element: <AdminLayout />,
        children: [
          { index: true, element: <Navigate to="/admin/users" replace /> },
          { path: 'users', element: <AdminUsersRoute /> },
          { path: 'outbox', element: <AdminOutboxRoute /> },
          { path: 'audit-log', element: <AdminAuditLogRoute /> },
        ],
      },
      { path: '*', element: <NotFoundRoute /> },
    ],
  },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
