import type { Permission } from '@emberline/contracts/permissions';
import { Notice } from '../../components/ui/notice';
import { PageHeader } from '../../components/ui/page';
import { RequirePermission } from '../../features/auth/components/require-permission';

/**
 * A screen of the navigation that a later release builds. It says so plainly rather than showing
 * empty tables that look like real data.
 */
export function NotBuiltYet({
  title,
  permission,
  purpose,
}: {
  title: string;
  permission: Permission;
  purpose: string;
}) {
  return (
    <RequirePermission permission={permission}>
      <PageHeader title={title} description={purpose} />
      <Notice title="Not built yet">
        This screen is not part of this version of Emberline. It is planned, and nothing here is
        real data yet.
      </Notice>
    </RequirePermission>
  );
}
