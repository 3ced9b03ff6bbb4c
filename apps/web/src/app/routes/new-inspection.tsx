import { useNavigate, useParams } from 'react-router-dom';
import { Notice } from '../../components/ui/notice';
import { LoadingLine, PageHeader, Panel } from '../../components/ui/page';
import { RequirePermission } from '../../features/auth/components/require-permission';
import { useSignedInUser } from '../../features/auth/hooks/use-signed-in-user';
import { useEngineModel } from '../../features/engine-models/api/engine-models';
import { useEngine } from '../../features/fleet/api/engines';
import { useInspectionDefaults } from '../../features/inspections/api/inspections';
import { InspectionForm } from '../../features/inspections/components/inspection-form';

export function NewInspectionRoute() {
  const { engineId = '' } = useParams();
  const user = useSignedInUser();
  const engine = useEngine(engineId);
  const model = useEngineModel(engine.data?.modelId ?? null);
  const defaults = useInspectionDefaults();
  const navigate = useNavigate();
  return (
    <RequirePermission permission="create:inspection">
      <PageHeader
        title="New inspection"
        description={
          engine.data
            ? `Engine ${engine.data.serialNumber} · ${engine.data.modelName} · ${engine.data.organisationName}`
            : undefined
        }
      />
      <Panel className="max-w-4xl">
        {engine.error ? (
          <Notice tone="error">{engine.error.message}</Notice>
        ) : !engine.data || !model.data || defaults.isPending ? (
          <LoadingLine />
        ) : (
          <InspectionForm
            engine={engine.data}
            rows={model.data.rows}
            inspectorName={user.name}
            defaults={defaults.data}
            onCreated={(inspection) => navigate(`/inspections/${inspection.id}`)}
          />
        )}
      </Panel>
    </RequirePermission>
  );
}
