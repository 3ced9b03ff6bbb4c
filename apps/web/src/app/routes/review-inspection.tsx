import { useEffect, useMemo, useState } from 'react';
import { cautions } from '@emberline/contracts/cautions';
import type { Finding } from '@emberline/contracts/findings';
import { inspectionStateLabels } from '@emberline/contracts/inspections';
import { decisionWords } from '@emberline/domain/decision-words';
import { annotationOverlay } from '@emberline/drawings/overlay';
import { ArrowLeft } from 'lucide-react';
import { Link, useParams } from 'react-router-dom';
import { ImageViewer } from '../../components/image-viewer';
import { SvgDrawing } from '../../components/ui/svg-drawing';
import { Button } from '../../components/ui/button';
import { Notice } from '../../components/ui/notice';
import { LoadingLine, PageHeader, Panel } from '../../components/ui/page';
import { VerdictBadge } from '../../components/ui/verdict-badge';
import { RecordHistory } from '../../features/audit/components/record-history';
import { RequirePermission } from '../../features/auth/components/require-permission';
import { useEngineModel } from '../../features/engine-models/api/engine-models';
import { useEngine } from '../../features/fleet/api/engines';
import { useFindings } from '../../features/findings/api/findings';
import { useInspection } from '../../features/inspections/api/inspections';
import { useInspectionReview } from '../../features/review/api/review';
import { DecisionForm } from '../../features/review/components/decision-form';
import { FindingReview } from '../../features/review/components/finding-review';
import { OutcomePanel } from '../../features/review/components/outcome-panel';
import { formatDate, formatDateTime } from '../../lib/format';

const DECISION_FORM = 'decision-form';

/** Whether a key press belongs to a text field or an open dialog, not to the screen's shortcuts. */
function typing(target: EventTarget | null): boolean {
  if (document.querySelector('dialog[open]')) return true;
  const element = target as HTMLElement | null;
  return Boolean(
    element &&
    (element.isContentEditable || ['INPUT', 'TEXTAREA', 'SELECT'].includes(element.tagName)),
  );
}

function DispositionScreen({ inspectionId }: { inspectionId: string }) {
  const inspection = useInspection(inspectionId);
  const findings = useFindings(inspectionId);
  const review = useInspectionReview(inspectionId);
  const engine = useEngine(inspection.data?.engineId ?? '');
  const model = useEngineModel(engine.data?.modelId ?? null);
  const [selectedId, setSelectedId] = useState<string | null>(null);
  const [imageIndex, setImageIndex] = useState<number | null>(null);
  const [correcting, setCorrecting] = useState(false);
  /** The finding just signed: once the review shows it decided, the next undecided one opens. */
  const [advanceFrom, setAdvanceFrom] = useState<string | null>(null);

  const recorded = useMemo(
    () => (findings.data?.items ?? []).filter((item) => item.status === 'recorded'),
    [findings.data],
  );
  const selected: Finding | undefined =
    recorded.find((item) => item.id === selectedId) ?? recorded[0];
  const index = selected ? recorded.indexOf(selected) : -1;
  const go = (step: number) => {
    if (recorded.length === 0) return;
    const next = recorded[(index + step + recorded.length) % recorded.length]!;
    setSelectedId(next.id);
    setImageIndex(null);
    setCorrecting(false);
  };

  // Once the review shows the finding just signed as decided, the next undecided one opens (state
  // adjusted while rendering, as React advises for what follows from new data).
  const reviewItems = review.data?.items;
  if (advanceFrom && reviewItems) {
    const decided = new Set(
      reviewItems.filter((item) => item.current).map((item) => item.findingId),
    );
    if (decided.has(advanceFrom)) {
      const next = recorded.find((item) => !decided.has(item.id));
      if (next) setSelectedId(next.id);
      setImageIndex(null);
      setAdvanceFrom(null);
    }
  }

  useEffect(() => {
    const onKey = (event: KeyboardEvent) => {
      if (event.ctrlKey || event.metaKey || event.altKey || typing(event.target)) return;
      const key = event.key.toLowerCase();
      if (key === 'n') go(1);
      else if (key === 'p') go(-1);
      else if (key === 's') {
        const form = document.getElementById(DECISION_FORM) as HTMLFormElement | null;
        if (!form) return;
        event.preventDefault();
        form.requestSubmit();
      } else return;
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  });

  if (inspection.isPending || findings.isPending || review.isPending) return <LoadingLine />;
  const error = inspection.error ?? findings.error ?? review.error;
  if (error) return <Notice tone="error">{error.message}</Notice>;
  const data = inspection.data!;
  const reviewData = review.data!;
  const rows = new Map((model.data?.rows ?? []).map((row) => [row.key, row.label]));
  const rowLabel = (key: string) => rows.get(key) ?? key;
  const dispositionsOf = (findingId: string) =>
    reviewData.items.filter((item) => item.findingId === findingId);
  const currentOf = (findingId: string) =>
    reviewData.items.find((item) => item.findingId === findingId && item.current) ?? null;
  const findingImageIndex = selected
    ? data.images.findIndex((image) => image.id === selected.imageId)
    : 0;
  const shownIndex = imageIndex ?? Math.max(findingImageIndex, 0);
  const current = selected ? currentOf(selected.id) : null;
  const recurrence = selected
    ? reviewData.recurrences.find((item) => item.findingId === selected.id)
    : undefined;
  const deciding = data.state !== 'draft' && selected && (!current || correcting);

  return (
    <div className="flex flex-col gap-6">
      <Link
        to={`/inspections/${data.id}`}
        className="inline-flex items-center gap-1 text-sm text-ember-800 hover:underline"
      >
        <ArrowLeft className="size-4" aria-hidden /> The inspection as recorded
      </Link>
      <PageHeader
        title={`Review of ${data.engineSerialNumber}, ${formatDate(data.date)}`}
        description={`${inspectionStateLabels[data.state]} · submitted ${formatDateTime(data.submittedAt)} · inspector ${data.inspectorName}`}
      />
      <Notice tone="caution">{cautions.dispositions}</Notice>
      {data.newerRevisionInForce ? (
        <Notice tone="caution" title="A newer limit revision is in force">
          This inspection keeps the revision it was judged against when it was submitted. Decide
          whether the newer one changes any decision, and correct or send it back if it does.
        </Notice>
      ) : null}
      {!reviewData.signing.allowed && data.state !== 'released' ? (
        <Notice tone="error" title="You cannot sign here">
          {reviewData.signing.reason}
        </Notice>
      ) : null}
      {data.state === 'draft' ? (
        <Notice>
          This inspection is a draft with its inspector: it is reviewed once it is submitted.
        </Notice>
      ) : null}
      <div className="grid gap-6 lg:grid-cols-[16rem_1fr]">
        <nav aria-label="Findings" className="flex flex-col gap-2">
          <p className="text-xs text-soot-600">
            Keys: <kbd>N</kbd> next, <kbd>P</kbd> previous, <kbd>S</kbd> sign.
          </p>
          <ol className="flex flex-col gap-1">
            {recorded.map((finding) => {
              const decided = currentOf(finding.id);
              return (
                <li key={finding.id}>
                  <button
                    type="button"
                    aria-current={finding.id === selected?.id ? 'true' : undefined}
                    onClick={() => {
                      setSelectedId(finding.id);
                      setImageIndex(null);
                      setCorrecting(false);
                    }}
                    className={`flex w-full flex-col gap-1 rounded border px-2 py-1.5 text-left text-sm ${finding.id === selected?.id ? 'border-ember-600 bg-ember-50' : 'border-soot-200 bg-white hover:bg-soot-50'}`}
                    data-testid="review-finding"
                  >
                    <span className="flex items-center gap-2">
                      <span className="font-semibold">F{finding.number}</span>
                      {finding.evaluation ? (
                        <VerdictBadge category={finding.evaluation.category} />
                      ) : null}
                    </span>
                    <span className="text-xs text-soot-700">
                      {rowLabel(finding.row)} {finding.position}
                    </span>
                    <span className="text-xs">
                      {decided
                        ? `${decisionWords(decided.decision)}${decided.concession ? ' (concession)' : ''}`
                        : 'To decide'}
                    </span>
                  </button>
                </li>
              );
            })}
          </ol>
          {recorded.length === 0 ? (
            <p className="text-sm text-soot-600">No findings recorded.</p>
          ) : null}
        </nav>
        <div className="flex min-w-0 flex-col gap-4">
          {selected ? (
            <Panel className="flex flex-col gap-4">
              <ImageViewer
                images={data.images}
                index={shownIndex}
                onIndex={setImageIndex}
                rowLabel={rowLabel}
                overlay={(image) => (
                  <svg
                    aria-hidden="true"
                    viewBox={`0 0 ${image.width} ${image.height}`}
                    className="pointer-events-none absolute inset-0 h-full w-full"
                  >
                    <SvgDrawing
                      drawing={annotationOverlay({
                        width: image.width,
                        height: image.height,
                        shapes: recorded
                          .filter((item) => item.imageId === image.id)
                          .map((item) => ({
                            id: item.id,
                            label: `F${item.number}`,
                            kind: item.shape.kind,
                            points: item.shape.points,
                            category: item.evaluation?.category ?? null,
                            selected: item.id === selected.id,
                          })),
                      })}
                      svgProps={{ x: 0, y: 0, width: image.width, height: image.height }}
                    />
                  </svg>
                )}
              />
              <FindingReview
                finding={selected}
                rowLabel={rowLabel(selected.row)}
                dispositions={dispositionsOf(selected.id)}
              />
              <RecordHistory key={selected.id} kind="findings" id={selected.id} />
              {current && !correcting && data.state !== 'draft' ? (
                <Button
                  variant="secondary"
                  className="self-start"
                  disabled={!reviewData.signing.allowed}
                  onClick={() => setCorrecting(true)}
                >
                  Correct this disposition…
                </Button>
              ) : null}
              {deciding && reviewData.signing.allowed ? (
                <DecisionForm
                  key={`${selected.id}-${current?.id ?? 'new'}`}
                  formId={DECISION_FORM}
                  inspectionId={data.id}
                  findingId={selected.id}
                  findingLabel={`F${selected.number}`}
                  evaluation={selected.evaluation}
                  supersedes={current}
                  recurrence={
                    recurrence
                      ? {
                          candidateFindingId: recurrence.candidateFindingId,
                          label: `F${recurrence.candidateNumber} of ${formatDate(recurrence.candidateInspectionDate)}`,
                        }
                      : null
                  }
                  onSigned={() => {
                    setCorrecting(false);
                    setAdvanceFrom(selected.id);
                  }}
                />
              ) : null}
            </Panel>
          ) : null}
          <Panel className="flex flex-col gap-3">
            <h2 className="text-lg font-semibold">Outcome and release</h2>
            <OutcomePanel inspection={data} review={reviewData} />
          </Panel>
          {reviewData.withdrawals.length > 0 ? (
            <Panel className="flex flex-col gap-2 text-sm">
              <h2 className="text-lg font-semibold">Withdrawals</h2>
              {reviewData.withdrawals.map((item) => (
                <p key={item.signature.id}>
                  {item.dispositionIds.length} disposition
                  {item.dispositionIds.length === 1 ? '' : 's'} withdrawn by{' '}
                  {item.signature.signerName}, {formatDateTime(item.signature.signedAt)}: “
                  {item.reason}”
                </p>
              ))}
            </Panel>
          ) : null}
        </div>
      </div>
    </div>
  );
}

export function ReviewInspectionRoute() {
  const { inspectionId = '' } = useParams();
  return (
    <RequirePermission permission="review:inspection">
      <DispositionScreen inspectionId={inspectionId} />
    </RequirePermission>
  );
}
