import { Panel } from '../../../components/ui/page';
import { useSignedInUser } from '../../../features/auth/hooks/use-signed-in-user';
import { InviteUserForm } from '../../../features/users/components/invite-user-form';
import { UsersTable } from '../../../features/users/components/users-table';

export function AdminUsersRoute() {
  const user = useSignedInUser();
  return (
    <div className="flex flex-col gap-6">
      <Panel>
        <InviteUserForm />
      </Panel>
      <Panel>
        <UsersTable currentUserId={user.id} />
      </Panel>
    </div>
  );
}
