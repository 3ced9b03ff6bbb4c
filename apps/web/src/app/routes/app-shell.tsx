import { can } from '@emberline/contracts/permissions';
import { roleLabels } from '@emberline/contracts/roles';
import { LogOut, UserRound } from 'lucide-react';
import { Link, NavLink, Outlet, useNavigate } from 'react-router-dom';
import { CautionLine } from '../../components/layout/caution-line';
import { UploadPanel } from '../../components/layout/upload-panel';
import { navigation } from '../../config/navigation';
import { useLogout } from '../../features/auth/api/auth';
import { useSignedInUser } from '../../features/auth/hooks/use-signed-in-user';
import { RecordsKeyBanner } from '../../features/installation/components/records-key-banner';
import { OutboxAttentionBanner } from '../../features/outbox/components/attention-banner';
import { UrgentNoticeBanner } from '../../features/reports/components/urgent-notice-banner';

export function AppShell() {
  const user = useSignedInUser();
  const logout = useLogout();
  const navigate = useNavigate();
  const items = navigation.filter((item) => can(user.role, item.permission));

  return (
    <div className="flex min-h-screen flex-col">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:bg-white focus:px-3 focus:py-2"
      >
        Skip to content
      </a>
      <header className="bg-soot-900 text-soot-100">
        <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-x-6 gap-y-2 px-6 py-3">
          <Link
            to="/"
            className="flex items-center gap-2 text-lg font-semibold tracking-tight text-white"
          >
            <img src="/emberline.svg" alt="" className="size-7" />
            Emberline
          </Link>
          <nav aria-label="Main" className="flex-1">
            <ul className="flex flex-wrap gap-1">
              {items.map((item) => (
                <li key={item.to}>
                  <NavLink
                    to={item.to}
                    className={({ isActive }) =>
                      `block rounded-md px-2.5 py-1.5 text-sm font-medium ${isActive ? 'bg-ember-700 text-white' : 'text-soot-200 hover:bg-soot-800 hover:text-white'}`
                    }
                  >
                    {item.label}
                  </NavLink>
                </li>
              ))}
            </ul>
          </nav>
          <div className="flex items-center gap-3 text-sm">
            <Link
              to="/account"
              className="flex items-center gap-2 rounded-md px-2 py-1 hover:bg-soot-800"
              title="Your account"
            >
              <UserRound className="size-4" aria-hidden />
              <span>
                <span className="block leading-tight text-white" data-testid="signed-in-name">
                  {user.name}
                </span>
                <span
                  className="block max-w-64 truncate text-xs leading-tight text-soot-200"
                  title={`${roleLabels[user.role]} · ${user.organisationName}`}
                >
                  {roleLabels[user.role]} · {user.organisationName}
                </span>
              </span>
            </Link>
            <button
              type="button"
              onClick={() =>
                logout.mutate(undefined, {
                  onSettled: () => navigate('/sign-in', { replace: true }),
                })
              }
              className="flex items-center gap-1.5 rounded-md border border-soot-700 px-3 py-1.5 text-soot-100 hover:bg-soot-800"
            >
              <LogOut className="size-4" aria-hidden />
              Sign out
            </button>
          </div>
        </div>
      </header>
      <RecordsKeyBanner />
      <UrgentNoticeBanner enabled={can(user.role, 'review:inspection')} />
      <OutboxAttentionBanner enabled={can(user.role, 'read:outbox')} />
      <main id="main" className="mx-auto w-full max-w-7xl flex-1 px-6 py-8">
        <Outlet />
      </main>
      <UploadPanel />
      <CautionLine />
    </div>
  );
}
