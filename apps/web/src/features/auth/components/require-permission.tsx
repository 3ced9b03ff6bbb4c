import type { ReactNode } from 'react';
import { can, type Permission } from '@emberline/contracts/permissions';
import { Notice } from '../../../components/ui/notice';
import { useSignedInUser } from '../hooks/use-signed-in-user';

/** Shows its children only to roles with the permission; the server enforces the same rule. */
export function RequirePermission({
  permission,
  children,
}: {
  permission: Permission;
  children: ReactNode;
}) {
  const user = useSignedInUser();
  if (!can(user.role, permission)) {
    return (
      <Notice tone="error" title="Not available to your role">
        This screen is not part of what your role may use. If you need it, ask an administrator.
      </Notice>
    );
  }
  return <>{children}</>;
}
