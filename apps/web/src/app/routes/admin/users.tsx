import { Panel } from '../../../components/ui/page';
import { useSignedInUser } from '../../../features/auth/hooks/use-signed-in-user';
import { useOrganisations } from '../../../features/organisations/api/organisations';
import { InviteUserForm } from '../../../features/users/components/invite-user-form';
import { UsersTable } from '../../../features/users/components/users-table';

export function AdminUsersRoute() {
  const user = useSignedInUser();
  const organisations = useOrganisations();
  return (
    <div className="flex flex-col gap-6">
      <Panel>
        <InviteUserForm organisations={organisations.data ?? []} />
      </Panel>
      <Panel>
        <UsersTable currentUserId={user.id} />
      </Panel>
    </div>
  );
}
