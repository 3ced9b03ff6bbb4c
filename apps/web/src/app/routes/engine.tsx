import { can } from '@emberline/contracts/permissions';
import { ArrowLeft } from 'lucide-react';
import { ExportLinks } from '../../components/ui/export-links';
import { Link, useParams } from 'react-router-dom';
import { Notice } from '../../components/ui/notice';
import { ApiError } from '../../lib/api-client';
import { formatDate } from '../../lib/format';
import { LoadingLine, PageHeader, Panel } from '../../components/ui/page';
import { useSignedInUser } from '../../features/auth/hooks/use-signed-in-user';
import { useEngine } from '../../features/fleet/api/engines';
import { EngineParticulars } from '../../features/fleet/components/engine-particulars';
import { EngineStatusForm } from '../../features/fleet/components/engine-status-form';
import { UtilizationPanel } from '../../features/fleet/components/utilization-panel';
import { useEngineDue } from '../../features/planning/api/planning';
import { DueCard } from '../../features/planning/components/due-card';
import { FindingTrendOf } from '../../features/review/components/finding-trend';
import { useEngineModel } from '../../features/engine-models/api/engine-models';
import { InspectionsList } from '../../features/inspections/components/inspections-list';

/**
 * The damage trends of the engine's open requirements: one chart per damage series with three
 * measurements or more (DESIGN §5.4), against the limits of the rule that judged its finding.
 */
function EngineTrends({ engineId }: { engineId: string }) {
  const due = useEngineDue(engineId);
  const findings = [
    ...new Map(
      (due.data?.requirements ?? []).map((requirement) => [
        requirement.seriesId,
        requirement.findingId,
      ]),
    ).values(),
  ];
  if (findings.length === 0) return null;
  return (
    <Panel>
      <h2 className="mb-4 text-lg font-semibold">Damage trends of the open requirements</h2>
      <div className="flex flex-col gap-6">
        {findings.map((findingId) => (
          <FindingTrendOf key={findingId} findingId={findingId} />
        ))}
      </div>
    </Panel>
  );
}

export function EngineRoute() {
  const { engineId = '' } = useParams();
  const user = useSignedInUser();
  const engine = useEngine(engineId);
  const model = useEngineModel(engine.data?.modelId ?? null);

  if (engine.isPending) return <LoadingLine />;
  if (engine.error) {
    return (
      <>
        <PageHeader title="Engine" />
        <Notice tone="error">
          {engine.error instanceof ApiError && engine.error.status === 404
            ? 'There is no such engine, or it is not shared with you.'
            : engine.error.message}
        </Notice>
      </>
    );
  }
  const data = engine.data;
  return (
    <div className="flex flex-col gap-6">
      <Link
        to="/fleet"
        className="inline-flex items-center gap-1 text-sm text-ember-800 hover:underline"
      >
        <ArrowLeft className="size-4" aria-hidden /> Fleet
      </Link>
      <PageHeader
        title={`Engine ${data.serialNumber}`}
        description={`${data.modelName} · ${data.organisationName}`}
      />
      {data.awaitingDisposition ? (
        <Notice
          tone={data.awaitingDisposition.beyondLimits ? 'error' : 'caution'}
          title={
            data.awaitingDisposition.beyondLimits
              ? 'Awaiting disposition, beyond limits'
              : 'Awaiting disposition'
          }
        >
          {data.awaitingDisposition.beyondLimits
            ? 'Its latest submitted inspection holds a finding beyond limits, not yet dispositioned by an engineer. '
            : 'Its latest submitted inspection waits for an engineer’s disposition. '}
          <Link
            to={
              can(user.role, 'review:inspection')
                ? `/review/${data.awaitingDisposition.inspectionId}`
                : `/inspections/${data.awaitingDisposition.inspectionId}`
            }
            className="font-medium underline"
          >
            {can(user.role, 'review:inspection') ? 'Open the review' : 'Open the inspection'}
          </Link>
        </Notice>
      ) : null}
      {data.inspectionInReview && !data.awaitingDisposition ? (
        <Notice
          tone="caution"
          title={`Inspection of ${formatDate(data.inspectionInReview)} in review`}
        >
          Its findings, verdicts and decisions are shown here, with the signed report, once it is
          released.
        </Notice>
      ) : null}
      <Panel>
        <h2 className="mb-4 text-lg font-semibold">Next due</h2>
        <DueCard
          engineId={data.id}
          serialNumber={data.serialNumber}
          canBook={can(user.role, 'plan:inspection')}
          asReleased={!can(user.role, 'read:all-organisations')}
          rowLabel={(key) => model.data?.rows.find((row) => row.key === key)?.label ?? key}
        />
      </Panel>
      {can(user.role, 'read:planning') ? <EngineTrends engineId={data.id} /> : null}
      <Panel>
        <h2 className="mb-4 text-lg font-semibold">Particulars</h2>
        <EngineParticulars engine={data} />
        {can(user.role, 'manage:engine') ? <EngineStatusForm engine={data} /> : null}
      </Panel>
      <Panel>
        <h2 className="mb-4 text-lg font-semibold">Utilization</h2>
        <UtilizationPanel engineId={data.id} canManage={can(user.role, 'manage:utilization')} />
      </Panel>
      <Panel>
        <div className="mb-3 flex items-center justify-between">
          <h2 className="text-lg font-semibold">Inspections</h2>
          {can(user.role, 'create:inspection') ? (
            <Link
              to={`/fleet/${data.id}/inspections/new`}
              className="rounded-md bg-ember-700 px-3.5 py-2 text-sm font-medium text-white hover:bg-ember-800"
            >
              New inspection
            </Link>
          ) : null}
        </div>
        <InspectionsList engineId={data.id} />
        <div className="mt-3">
          <ExportLinks
            path={`/engines/${encodeURIComponent(data.id)}/export`}
            formats={['csv', 'xlsx']}
          />
        </div>
      </Panel>
    </div>
  );
}
