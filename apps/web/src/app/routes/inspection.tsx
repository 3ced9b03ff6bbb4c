import { useState } from 'react';
import { inspectionReasonLabels, inspectionStateLabels } from '@emberline/contracts/inspections';
import { can } from '@emberline/contracts/permissions';
import { ArrowLeft } from 'lucide-react';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { Notice } from '../../components/ui/notice';
import { LoadingLine, PageHeader, Panel } from '../../components/ui/page';
import { useSignedInUser } from '../../features/auth/hooks/use-signed-in-user';
import { useEngineModel } from '../../features/engine-models/api/engine-models';
import { useEngine } from '../../features/fleet/api/engines';
import { useCoverage, useFindings, useLimitSetInForce } from '../../features/findings/api/findings';
import { Annotator } from '../../features/findings/components/annotator';
import { FindingsPanel } from '../../features/findings/components/findings-panel';
import { OutcomeSummary } from '../../features/findings/components/outcome-summary';
import { useInspection } from '../../features/inspections/api/inspections';
import {
  DraftParticulars,
  VoidNotice,
} from '../../features/inspections/components/draft-particulars';
import { FlagsPanel } from '../../features/inspections/components/flags-panel';
import { ImageDrop } from '../../features/inspections/components/image-drop';
import { ImageStrip } from '../../features/inspections/components/image-strip';
import { ImageTagForm } from '../../features/inspections/components/image-tag-form';
import { ReviewActions } from '../../features/inspections/components/review-actions';
import { VideoFrames } from '../../features/inspections/components/video-frames';
import { RecordHistory } from '../../features/audit/components/record-history';
import { FindingTrend } from '../../features/review/components/finding-trend';
import { DecisionsSummary } from '../../features/review/components/decisions-summary';
import { DeliveryLog } from '../../features/reports/components/delivery-log';
import { ApiError } from '../../lib/api-client';
import { ExportLinks } from '../../components/ui/export-links';
import { formatDate, formatHours } from '../../lib/format';

export function InspectionRoute() {
  const { inspectionId = '' } = useParams();
  const user = useSignedInUser();
  const inspection = useInspection(inspectionId);
  const engine = useEngine(inspection.data?.engineId ?? '');
  const model = useEngineModel(engine.data?.modelId ?? null);
  const [selected, setSelected] = useState(0);
  const findings = useFindings(inspectionId);
  // A link to one finding (`?finding=`, from a later finding of its series) opens its image.
  const [params] = useSearchParams();
  const linked = params.get('finding');
  const [openedLink, setOpenedLink] = useState<string | null>(null);
  if (linked && linked !== openedLink && findings.data && inspection.data) {
    const finding = findings.data.items.find((item) => item.id === linked);
    const at = finding
      ? inspection.data.images.findIndex((image) => image.id === finding.imageId)
      : -1;
    setOpenedLink(linked);
    if (at >= 0) setSelected(at);
  }
  const coverage = useCoverage(inspectionId);
  const limitSet = useLimitSetInForce(
    engine.data?.modelId ?? null,
    can(user.role, 'read:limit-set'),
  );

  if (inspection.isPending) return <LoadingLine />;
  if (inspection.error) {
    return (
      <Notice tone="error">
        {inspection.error instanceof ApiError && inspection.error.status === 404
          ? 'There is no such inspection, or it is not shared with you.'
          : inspection.error.message}
      </Notice>
    );
  }
  const data = inspection.data;
  const editable = data.state === 'draft' && can(user.role, 'create:inspection');
  const rows = (model.data?.rows ?? []).filter((row) => data.rows.includes(row.key));
  const rowLabel = (key: string) => model.data?.rows.find((row) => row.key === key)?.label ?? key;
  const particulars: [string, string][] = [
    ['Date', formatDate(data.date)],
    [
      'Reason',
      inspectionReasonLabels[data.reason] + (data.reasonDetail ? ` (${data.reasonDetail})` : ''),
    ],
    ['CSN / TSN', `${data.csn.toLocaleString('en-GB')} / ${formatHours(data.tsn)} h`],
    [
      'Inspector',
      `${data.inspectorName} · ${data.qualificationRef}, valid to ${formatDate(data.qualificationExpiresOn)}`,
    ],
    ['Probe', `${data.probe} · calibration due ${formatDate(data.probeCalibrationDueOn)}`],
    ['Rows inspected', rows.map((row) => row.label).join(', ') || data.rows.join(', ')],
  ];

  return (
    <div className="flex flex-col gap-6">
      <Link
        to={`/fleet/${data.engineId}`}
        className="inline-flex items-center gap-1 text-sm text-ember-800 hover:underline"
      >
        <ArrowLeft className="size-4" aria-hidden /> Engine {data.engineSerialNumber}
      </Link>
      <PageHeader
        title={`Inspection of ${data.engineSerialNumber}, ${formatDate(data.date)}`}
        description={inspectionStateLabels[data.state]}
      />
      <Panel>
        <dl className="grid gap-x-6 gap-y-3 text-sm sm:grid-cols-2 lg:grid-cols-3">
          {particulars.map(([label, value]) => (
            <div key={label}>
              <dt className="text-xs uppercase tracking-wide text-soot-600">{label}</dt>
              <dd className="mt-0.5 font-medium">{value}</dd>
            </div>
          ))}
        </dl>
        {editable && engine.data && model.data ? (
          <DraftParticulars inspection={data} engine={engine.data} rows={model.data.rows} />
        ) : null}
      </Panel>
      {data.state === 'void' ? <VoidNotice inspection={data} /> : null}
      {data.state === 'void' ? null : (
        <Panel>
          <h2 className="mb-3 text-lg font-semibold">Flags</h2>
          <FlagsPanel inspection={data} canAcknowledge={editable} />
          <div className="mt-4 border-t border-soot-200 pt-4">
            <ReviewActions
              inspection={data}
              canSubmit={can(user.role, 'create:inspection')}
              canReview={can(user.role, 'review:inspection')}
              coverageGaps={(coverage.data?.outcome.coverageGaps ?? []).map(rowLabel)}
              findingCount={
                findings.data?.items.filter((item) => item.status === 'recorded').length ?? 0
              }
              verdicts={(findings.data?.items ?? [])
                .filter((item) => item.status === 'recorded')
                .map((item) => item.evaluation?.category ?? null)}
            />
          </div>
        </Panel>
      )}
      {data.state !== 'draft' && data.state !== 'void' ? (
        <Panel className="flex flex-col gap-3">
          <h2 className="text-lg font-semibold">Decisions</h2>
          <DecisionsSummary inspectionId={data.id} />
        </Panel>
      ) : null}
      {data.state === 'released' ? (
        <Panel className="flex flex-col gap-3">
          <h2 className="text-lg font-semibold">E-mails to the owner</h2>
          <DeliveryLog inspectionId={data.id} />
        </Panel>
      ) : null}
      <Panel className="flex flex-col gap-4">
        <h2 className="text-lg font-semibold">
          Images <span className="text-sm font-normal text-soot-600">({data.images.length})</span>
        </h2>
        {editable ? <ImageDrop inspectionId={data.id} /> : null}
        <ImageStrip images={data.images} selected={selected} onSelect={setSelected} />
        {data.images.length > 0 ? (
          <div id="image-viewer">
            <Annotator
              inspection={data}
              rows={rows}
              index={selected}
              onIndex={setSelected}
              findings={findings.data?.items ?? []}
              limitSet={limitSet.data}
              editable={editable}
              imageDetails={(image) => (
                <ImageTagForm
                  key={image.id}
                  image={image}
                  rows={rows}
                  inspectionId={data.id}
                  ports={[
                    ...new Set(data.images.flatMap((other) => (other.port ? [other.port] : []))),
                  ]}
                  editable={editable}
                />
              )}
            />
          </div>
        ) : null}
      </Panel>
      <Panel className="flex flex-col gap-4">
        <div className="flex flex-wrap items-baseline justify-between gap-2">
          <h2 className="text-lg font-semibold">Findings and coverage</h2>
          <ExportLinks
            label="Export"
            path={`/inspections/${encodeURIComponent(data.id)}/export`}
            formats={['csv', 'xlsx', 'json']}
          />
        </div>
        {data.state === 'void' ? null : findings.data ? (
          <OutcomeSummary outcome={findings.data.outcome} rowLabel={rowLabel} />
        ) : (
          <LoadingLine />
        )}
        {findings.error ? <Notice tone="error">{findings.error.message}</Notice> : null}
        {findings.data && coverage.data ? (
          <FindingsPanel
            inspectionId={data.id}
            rows={rows}
            findings={findings.data.items}
            coverage={coverage.data.rows}
            editable={editable}
            rulesReadable={can(user.role, 'read:limit-set')}
            trend={
              can(user.role, 'read:limit-set')
                ? (finding) => <FindingTrend finding={finding} />
                : undefined
            }
            onOpen={(finding) => {
              const at = data.images.findIndex((image) => image.id === finding.imageId);
              if (at >= 0) setSelected(at);
              document
                .getElementById('image-viewer')
                ?.scrollIntoView({ behavior: 'smooth', block: 'start' });
            }}
          />
        ) : null}
      </Panel>
      {editable ? (
        <Panel>
          <h2 className="mb-3 text-lg font-semibold">Frames from a probe video</h2>
          <VideoFrames inspectionId={data.id} />
        </Panel>
      ) : null}
      {can(user.role, 'read:history') ? (
        <Panel>
          <RecordHistory kind="inspections" id={data.id} />
        </Panel>
      ) : null}
    </div>
  );
}
