import { useNavigate } from 'react-router-dom';
import { LoadingLine, PageHeader, Panel } from '../../components/ui/page';
import { RequirePermission } from '../../features/auth/components/require-permission';
import { useEngineModels } from '../../features/engine-models/api/engine-models';
import { EngineForm } from '../../features/fleet/components/engine-form';
import { useOrganisations } from '../../features/organisations/api/organisations';

export function NewEngineRoute() {
  const models = useEngineModels();
  const owners = useOrganisations();
  const navigate = useNavigate();
  return (
    <RequirePermission permission="manage:engine">
      <PageHeader
        title="Add an engine"
        description="An engine of a model in Emberline, owned by one of the customer organisations."
      />
      <Panel className="max-w-3xl">
        {models.isPending || owners.isPending ? (
          <LoadingLine />
        ) : (
          <EngineForm
            models={models.data ?? []}
            owners={owners.data ?? []}
            onCreated={(engine) => navigate(`/fleet/${engine.id}`)}
          />
        )}
      </Panel>
    </RequirePermission>
  );
}
