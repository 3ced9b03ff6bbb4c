import { Panel } from '../../../components/ui/page';
import { useSignedInUser } from '../../../features/auth/hooks/use-signed-in-user';
import { useEngineModels } from '../../../features/engine-models/api/engine-models';
import { useOrganisations } from '../../../features/organisations/api/organisations';
import { CredentialsPanel } from '../../../features/users/components/credentials-panel';
import { InviteUserForm } from '../../../features/users/components/invite-user-form';
import { UsersTable } from '../../../features/users/components/users-table';

export function AdminUsersRoute() {
  const user = useSignedInUser();
  const organisations = useOrganisations();
  const models = useEngineModels();
  return (
    <div className="flex flex-col gap-6">
      <Panel>
        <InviteUserForm organisations={organisations.data ?? []} />
      </Panel>
      <Panel>
        <UsersTable currentUserId={user.id} />
      </Panel>
      <Panel>
        <CredentialsPanel
          currentUserId={user.id}
          models={(models.data ?? []).map((model) => ({ id: model.id, name: model.name }))}
        />
      </Panel>
    </div>
  );
}
