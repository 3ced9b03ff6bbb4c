import { NavLink, Outlet } from 'react-router-dom';
import { PageHeader } from '../../../components/ui/page';
import { RequirePermission } from '../../../features/auth/components/require-permission';

const sections = [
  { to: '/admin/users', label: 'Users' },
  { to: '/admin/organisations', label: 'Organisations' },
  { to: '/admin/engine-models', label: 'Engine models' },
  { to: '/admin/outbox', label: 'Outbox' },
  { to: '/admin/audit-log', label: 'Audit log' },
  { to: '/admin/records', label: 'Records check' },
];

export function AdminLayout() {
  return (
    <RequirePermission permission="manage:user">
      <PageHeader
        title="Admin"
        description="People and their roles; customer organisations and their report contacts; engine models; the mail Emberline has sent; the record of every change."
      />
      <nav aria-label="Admin sections" className="mb-6">
        <ul className="flex gap-1 border-b border-soot-200">
          {sections.map((section) => (
            <li key={section.to}>
              <NavLink
                to={section.to}
                className={({ isActive }) =>
                  `-mb-px block border-b-2 px-4 py-2 text-sm font-medium ${isActive ? 'border-ember-600 text-ember-800' : 'border-transparent text-soot-600 hover:text-soot-900'}`
                }
              >
                {section.label}
              </NavLink>
            </li>
          ))}
        </ul>
      </nav>
      <Outlet />
    </RequirePermission>
  );
}
