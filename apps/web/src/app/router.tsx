import { createBrowserRouter, Navigate, RouterProvider } from 'react-router-dom';
import { LoadingLine } from '../components/ui/page';
import { RequireAuth } from '../features/auth/components/require-auth';
import { AppShell } from './routes/app-shell';
import { FleetRoute } from './routes/fleet';
import { NotFoundRoute } from './routes/not-found';
import { SignInRoute } from './routes/sign-in';

// Sign-in, the shell and the fleet list load first; every other screen is its own chunk.
const router = createBrowserRouter([
  { path: '/sign-in', element: <SignInRoute /> },
  {
    path: '/forgot-password',
    lazy: async () => ({
      Component: (await import('./routes/forgot-password')).ForgotPasswordRoute,
    }),
  },
  {
    path: '/reset-password',
    lazy: async () => ({ Component: (await import('./routes/reset-password')).ResetPasswordRoute }),
  },
  {
    path: '/verify/:code',
    lazy: async () => ({ Component: (await import('./routes/verify')).VerifyRoute }),
  },
  {
    path: '/accept-invitation',
    lazy: async () => ({
      Component: (await import('./routes/accept-invitation')).AcceptInvitationRoute,
    }),
  },
  {
    element: (
      <RequireAuth>
        <AppShell />
      </RequireAuth>
    ),
    hydrateFallbackElement: <LoadingLine />,
    children: [
      { index: true, element: <Navigate to="/fleet" replace /> },
      { path: 'fleet', element: <FleetRoute /> },
      {
        path: 'fleet/new',
        lazy: async () => ({ Component: (await import('./routes/new-engine')).NewEngineRoute }),
      },
      {
        path: 'fleet/:engineId',
        lazy: async () => ({ Component: (await import('./routes/engine')).EngineRoute }),
      },
      {
        path: 'fleet/:engineId/inspections/new',
        lazy: async () => ({
          Component: (await import('./routes/new-inspection')).NewInspectionRoute,
        }),
      },
      {
        path: 'inspections/:inspectionId',
        lazy: async () => ({ Component: (await import('./routes/inspection')).InspectionRoute }),
      },
      {
        path: 'review',
        lazy: async () => ({ Component: (await import('./routes/review')).ReviewQueueRoute }),
      },
      {
        path: 'review/:inspectionId',
        lazy: async () => ({
          Component: (await import('./routes/review-inspection')).ReviewInspectionRoute,
        }),
      },
      {
        path: 'limits',
        lazy: async () => ({ Component: (await import('./routes/limits')).LimitLibraryRoute }),
      },
      {
        path: 'limits/:limitSetId',
        lazy: async () => ({ Component: (await import('./routes/limit-set')).LimitSetRoute }),
      },
      {
        path: 'planning',
        lazy: async () => ({ Component: (await import('./routes/planning')).PlanningRoute }),
      },
      {
        path: 'findings',
        lazy: async () => ({ Component: (await import('./routes/findings')).FindingsRoute }),
      },
      {
        path: 'reports',
        lazy: async () => ({ Component: (await import('./routes/reports')).ReportsRoute }),
      },
      {
        path: 'account',
        lazy: async () => ({ Component: (await import('./routes/account')).AccountRoute }),
      },
      {
        path: 'admin',
        lazy: async () => ({
          Component: (await import('./routes/admin/admin-layout')).AdminLayout,
        }),
        children: [
          { index: true, element: <Navigate to="/admin/users" replace /> },
          {
            path: 'users',
            lazy: async () => ({
              Component: (await import('./routes/admin/users')).AdminUsersRoute,
            }),
          },
          {
            path: 'organisations',
            lazy: async () => ({
              Component: (await import('./routes/admin/organisations')).AdminOrganisationsRoute,
            }),
          },
          {
            path: 'engine-models',
            lazy: async () => ({
              Component: (await import('./routes/admin/engine-models')).AdminEngineModelsRoute,
            }),
          },
          {
            path: 'engine-models/new',
            lazy: async () => ({
              Component: (await import('./routes/admin/engine-model')).AdminEngineModelRoute,
            }),
          },
          {
            path: 'engine-models/:modelId',
            lazy: async () => ({
              Component: (await import('./routes/admin/engine-model')).AdminEngineModelRoute,
            }),
          },
          {
            path: 'outbox',
            lazy: async () => ({
              Component: (await import('./routes/admin/outbox')).AdminOutboxRoute,
            }),
          },
          {
            path: 'audit-log',
            lazy: async () => ({
              Component: (await import('./routes/admin/audit-log')).AdminAuditLogRoute,
            }),
          },
          {
            path: 'records',
            lazy: async () => ({
              Component: (await import('./routes/admin/records')).AdminRecordsRoute,
            }),
          },
        ],
      },
      { path: '*', element: <NotFoundRoute /> },
    ],
  },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
