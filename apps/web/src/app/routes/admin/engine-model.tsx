import { useNavigate, useParams } from 'react-router-dom';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { LoadingLine, Panel } from '../../../components/ui/page';
import {
  useEngineModel,
  useNewEngineModelVersion,
} from '../../../features/engine-models/api/engine-models';
import { EngineModelForm } from '../../../features/engine-models/components/engine-model-form';

export function AdminEngineModelRoute() {
  const { modelId } = useParams();
  const model = useEngineModel(modelId ?? null);
  const version = useNewEngineModelVersion();
  const navigate = useNavigate();
  const isNew = !modelId;

  if (!isNew && model.isPending) return <LoadingLine />;
  if (!isNew && model.error) return <Notice tone="error">{model.error.message}</Notice>;
  const current = isNew ? null : (model.data ?? null);

  return (
    <Panel>
      <div className="mb-4 flex flex-wrap items-center justify-between gap-3">
        <h2 className="text-lg font-semibold">
          {current ? `${current.name} v${current.version}` : 'New engine model'}
        </h2>
        {current ? (
          <Button
            variant="secondary"
            busy={version.isPending}
            onClick={() =>
              version.mutate(current.id, {
                onSuccess: (next) => navigate(`/admin/engine-models/${next.id}`),
              })
            }
          >
            Make version {current.version + 1}
          </Button>
        ) : null}
      </div>
      {current && current.engineCount > 0 ? (
        <p className="mb-4 text-sm text-soot-600">
          {current.engineCount} engine{current.engineCount === 1 ? ' is' : 's are'} of this model.
          Rows that findings refer to keep their positions, numbering and zones; for such a change,
          make a new version.
        </p>
      ) : null}
      <EngineModelForm
        key={current?.id ?? 'new'}
        model={current}
        onSaved={(saved) => navigate(`/admin/engine-models/${saved.id}`, { replace: true })}
      />
      {version.error ? <Notice tone="error">{version.error.message}</Notice> : null}
    </Panel>
  );
}
