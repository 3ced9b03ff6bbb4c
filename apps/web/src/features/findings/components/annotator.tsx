import {
  useEffect,
  useMemo,
  useReducer,
  useState,
  type ButtonHTMLAttributes,
  type ReactNode,
} from 'react';
import { cautions } from '@emberline/contracts/cautions';
import {
  findingDetailsSchema,
  type Finding,
  type FindingInput,
} from '@emberline/contracts/findings';
import type { EngineModelRow } from '@emberline/contracts/fleet';
import type { Image, InspectionDetail } from '@emberline/contracts/inspections';
import type { LimitSet } from '@emberline/contracts/limit-sets';
import type { Category } from '@emberline/contracts/limits';
import type { Calibration } from '@emberline/contracts/measurement';
import { verdictStyles } from '@emberline/drawings/verdict-style';
import { Button } from '../../../components/ui/button';
import { Input, Select } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { applyServerErrors, useZodForm } from '../../../lib/form';
import { ImageViewer } from '../../../components/image-viewer';
import { useCalibrateImage, useRecordFinding, useSeriesCandidates } from '../api/findings';
import {
  annotationReducer,
  calibrationFrom,
  initialAnnotation,
  MM_PER_INCH,
  shapeOf,
  toolList,
} from '../lib/annotation';
import { liveMeasurement, liveVerdict } from '../lib/live';
import { DrawingLayer } from './drawing-layer';
import { FindingFields } from './finding-fields';
import { blankDetails } from '../lib/finding-details';
import { VerdictBadge } from '../../../components/ui/verdict-badge';
import { VerdictBasis } from '../../../components/verdict-basis';

const mm = (value: number | null | undefined, digits = 3) =>
  value === null || value === undefined ? '—' : value.toFixed(digits);

function ToolButton(props: ButtonHTMLAttributes<HTMLButtonElement>) {
  return (
    <button
      type="button"
      className="rounded border border-soot-600 px-2 py-1 hover:bg-soot-800 disabled:opacity-40"
      {...props}
    />
  );
}

interface CalibrationChoice {
  calibration: Calibration;
  sourceImageId: string;
}

function Figure({ label, value, testId }: { label: string; value: ReactNode; testId?: string }) {
  return (
    <div>
      <dt className="text-xs uppercase tracking-wide text-soot-600">{label}</dt>
      <dd className="font-mono text-sm" data-testid={testId}>
        {value}
      </dd>
    </div>
  );
}

/**
 * The inspector's bench: the viewer with the drawing tools over the image, the calibration, the
 * live measurement and verdict (the shared domain code, as the server will compute them), and the
 * form that records the finding.
 */
export function Annotator({
  inspection,
  rows,
  index,
  onIndex,
  findings,
  limitSet,
  editable,
  imageDetails,
}: {
  inspection: InspectionDetail;
  rows: EngineModelRow[];
  index: number;
  onIndex: (index: number) => void;
  findings: Finding[];
  limitSet: LimitSet | null | undefined;
  editable: boolean;
  /** Shown beneath the still: the inspection's own form for the row and position it shows. */
  imageDetails?: (image: Image) => ReactNode;
}) {
  const images = inspection.images;
  const image = images[Math.min(index, images.length - 1)]!;
  const [state, dispatch] = useReducer(annotationReducer, initialAnnotation);
  const calibrate = useCalibrateImage(inspection.id);
  const [pickUncertainty, setPickUncertainty] = useState('1');
  const [trueSize, setTrueSize] = useState({
    length: '',
    width: '',
    height: '',
    unit: 'mm' as 'mm' | 'in',
  });
  const recorded = findings.filter((finding) => finding.status === 'recorded');

  // The scale saved with the still, else (for stills scaled before scales were saved with them)
  // the one the last finding on it used.
  const fromFindings = recorded.findLast(
    (finding) => finding.imageId === image.id && finding.calibration,
  );
  const calibration: CalibrationChoice | null =
    image.calibration ??
    (fromFindings?.calibration
      ? {
          calibration: fromFindings.calibration.calibration,
          sourceImageId: fromFindings.calibration.imageId,
        }
      : null);
  const nameOf = (id: string) =>
    images.find((other) => other.id === id)?.originalName ?? 'another still';
  // A scale carries over only between stills of one size taken through one port.
  const reusable = images.filter(
    (other) =>
      other.id !== image.id &&
      other.width === image.width &&
      other.height === image.height &&
      (other.port ?? null) === (image.port ?? null) &&
      other.calibration,
  );

  const u = Math.max(0, Number(pickUncertainty) || 0);
  const kind = shapeOf(state.tool);
  const shape = kind && state.points.length > 0 ? { kind, points: state.points } : null;
  const measurement = liveMeasurement(calibration?.calibration ?? null, shape, u);

  const form = useZodForm(findingDetailsSchema, {
    defaultValues: blankDetails(
      rows.find((candidate) => candidate.key === (image.rowKey ?? inspection.rows[0])),
      image.position,
    ),
  });
  // The form follows the still's tag: when it is shown, and when it is tagged or re-tagged.
  const tagged = rows.find((candidate) => candidate.key === image.rowKey);
  const tagPosition = image.position;
  useEffect(() => {
    if (!tagged || !tagPosition) return;
    form.setValue('row', tagged.key);
    form.setValue('zone', tagged.zones[0] ?? '');
    form.setValue('position', tagPosition);
  }, [form, image.id, tagged, tagPosition]);
  // The tool letters work wherever the annotator is on screen, unless a text field has the focus
  // (the drawing area handles its own keys first and marks them handled).
  useEffect(() => {
    if (!editable) return;
    const onKey = (event: globalThis.KeyboardEvent) => {
      if (event.defaultPrevented || event.ctrlKey || event.metaKey || event.altKey) return;
      const target = event.target as HTMLElement | null;
      if (target?.closest('input, textarea, select, [contenteditable="true"]')) return;
      const tool = toolList.find((item) => item.key.toLowerCase() === event.key.toLowerCase());
      if (!tool) return;
      dispatch({ type: 'choose', tool: tool.tool });
      event.preventDefault();
    };
    document.addEventListener('keydown', onKey);
    return () => document.removeEventListener('keydown', onKey);
  }, [editable]);
  // A finding placed elsewhere than the still's tag is recorded only once the inspector says so.
  const [elsewhereConfirmed, setElsewhereConfirmed] = useState<string | null>(null);
  const details = form.watch();
  const row = rows.find((candidate) => candidate.key === details.row);
  const zone = row?.zones.includes(details.zone) ? details.zone : (row?.zones[0] ?? '');
  const position = details.position;
  const located = row && Number.isInteger(position) && position >= 1 && position <= row.count;

  const values =
    details.method === 'probe'
      ? {
          lengthMm: details.lengthMm ?? null,
          areaMm2: details.areaMm2 ?? null,
          uncertaintyMm: details.uncertaintyMm ?? null,
          uncertaintyMm2: details.uncertaintyMm2 ?? null,
        }
      : {
          lengthMm: measurement?.value?.lengthMm ?? null,
          areaMm2: measurement?.value?.areaMm2 ?? null,
          uncertaintyMm: measurement?.value?.uncertaintyMm ?? null,
          uncertaintyMm2: measurement?.value?.uncertaintyMm2 ?? null,
        };
  // The whole inspection judged with the new finding, as the server will judge it: fast enough
  // to run on every change of the drawing or the form.
  const verdict =
    located && limitSet && state.complete && kind
      ? liveVerdict(rows, limitSet.rules, recorded, {
          id: 'new',
          row: details.row,
          position,
          zone,
          damage: details.damage,
          widthMm: details.widthMm ?? null,
          depthMm: details.depthMm ?? null,
          count: details.count ?? null,
          ...values,
        })
      : null;

  const candidates = useSeriesCandidates(
    inspection.id,
    editable && located ? { row: details.row, position, damage: details.damage } : null,
  );
  const record = useRecordFinding(inspection.id);
  const [announcement, setAnnouncement] = useState('');

  const shapesOnImage = useMemo(
    () =>
      findings
        .filter((finding) => finding.status === 'recorded' && finding.imageId === image.id)
        .map((finding) => ({
          id: finding.id,
          label: `F${finding.number}`,
          detail:
            finding.lengthMm !== null
              ? `${finding.lengthMm.toFixed(2)} mm`
              : finding.areaMm2 !== null
                ? `${finding.areaMm2.toFixed(1)} mm²`
                : undefined,
          kind: finding.shape.kind,
          points: finding.shape.points,
          category: (finding.evaluation?.category ?? null) as Category | null,
        })),
    [findings, image.id],
  );

  const toSize = (text: string) => {
    const value = Number(text);
    if (!(value > 0)) return undefined;
    return trueSize.unit === 'in' ? value * MM_PER_INCH : value;
  };
  const calibrating = (state.tool === 'reference' || state.tool === 'plane') && state.complete;
  const madeCalibration = calibrationFrom(state.tool, state.points, {
    lengthMm: toSize(trueSize.length),
    widthMm: toSize(trueSize.width),
    heightMm: toSize(trueSize.height),
  });

  const [formError, setFormError] = useState('');
  const elsewhere =
    tagged && tagPosition && (details.row !== tagged.key || details.position !== tagPosition)
      ? `${image.id}:${details.row}:${details.position}`
      : null;
  const submit = form.handleSubmit((entered) => {
    if (!shape) return;
    if (elsewhere && elsewhereConfirmed !== elsewhere) return;
    setFormError('');
    const input: FindingInput = {
      ...entered,
      imageId: image.id,
      shape,
      calibration: calibration?.calibration ?? null,
      calibrationImageId: calibration?.sourceImageId ?? null,
      pickUncertaintyPx: u,
    };
    record.mutate(input, {
      onSuccess: (finding) => {
        dispatch({ type: 'clear' });
        form.reset({
          ...blankDetails(row, entered.position),
          row: entered.row,
          zone: entered.zone,
          damage: entered.damage,
          method: entered.method,
        });
        setAnnouncement(
          `F${finding.number} recorded: ${finding.evaluation ? verdictStyles[finding.evaluation.category].label : 'not judged'}`,
        );
      },
      onError: (error) => setFormError(applyServerErrors(form, error)),
    });
  });

  const toolbar = editable ? (
    <div role="toolbar" aria-label="Drawing tools" className="flex flex-wrap gap-1 text-xs">
      {toolList.map((tool) => (
        <button
          key={tool.tool}
          type="button"
          title={`${tool.label} (${tool.key}): ${tool.hint}`}
          aria-keyshortcuts={tool.key}
          aria-pressed={state.tool === tool.tool}
          onClick={() => dispatch({ type: 'choose', tool: tool.tool })}
          className={`rounded border px-2 py-1 ${state.tool === tool.tool ? 'border-ember-400 bg-ember-700 text-white' : 'border-soot-600 hover:bg-soot-800'}`}
        >
          {tool.label} <kbd className="opacity-70">{tool.key}</kbd>
        </button>
      ))}
      <ToolButton
        title="Undo (Ctrl+Z)"
        aria-keyshortcuts="Control+Z"
        disabled={state.past.length === 0}
        onClick={() => dispatch({ type: 'undo' })}
      >
        Undo
      </ToolButton>
      <ToolButton
        title="Redo (Ctrl+Y)"
        aria-keyshortcuts="Control+Y"
        disabled={state.future.length === 0}
        onClick={() => dispatch({ type: 'redo' })}
      >
        Redo
      </ToolButton>
      {(state.tool === 'polyline' || state.tool === 'polygon') && !state.complete ? (
        <button
          type="button"
          title="Finish the shape (Enter)"
          className="rounded border border-soot-600 px-2 py-1 hover:bg-soot-800"
          onClick={() => dispatch({ type: 'finish' })}
        >
          Finish shape
        </button>
      ) : null}
    </div>
  ) : null;

  return (
    <div className="flex flex-col gap-3">
      <ImageViewer
        images={images}
        index={Math.min(index, images.length - 1)}
        onIndex={(next) => {
          dispatch({ type: 'clear' });
          onIndex(next);
        }}
        details={imageDetails}
        rowLabel={(key) => rows.find((row) => row.key === key)?.label ?? key}
        toolbar={toolbar}
        leftButtonPans={state.tool === 'pan'}
        overlay={(shown) => (
          <DrawingLayer
            image={shown}
            state={state}
            dispatch={dispatch}
            shapes={shown.id === image.id ? shapesOnImage : []}
            calibration={calibration?.calibration ?? null}
            draftCategory={verdict?.value?.category ?? null}
          />
        )}
      />
      {editable ? (
        <div className="grid gap-4 rounded-lg border border-soot-200 bg-white p-4 lg:grid-cols-3">
          <section aria-labelledby="calibration-heading" className="flex flex-col gap-2 text-sm">
            <h3 id="calibration-heading" className="font-semibold">
              Scale
            </h3>
            <p data-testid="calibration-state">
              {calibration
                ? calibration.calibration.kind === 'reference'
                  ? `Reference of ${calibration.calibration.lengthMm} mm`
                  : `Plane ${calibration.calibration.widthMm} × ${calibration.calibration.heightMm} mm`
                : 'Not calibrated: pick a reference (R) or a plane (C).'}
              {calibration && calibration.sourceImageId !== image.id
                ? `, reused from ${nameOf(calibration.sourceImageId)}`
                : ''}
              {image.calibration ? ' · saved with this still' : ''}
            </p>
            {calibrate.error ? <Notice tone="error">{calibrate.error.message}</Notice> : null}
            {calibrating ? (
              <form
                className="flex flex-wrap items-end gap-2"
                aria-label="True size of the reference"
                onSubmit={(event) => {
                  event.preventDefault();
                  if (!madeCalibration) return;
                  calibrate.mutate(
                    { imageId: image.id, input: { calibration: madeCalibration } },
                    { onSuccess: () => dispatch({ type: 'choose', tool: 'polyline' }) },
                  );
                }}
              >
                {state.tool === 'reference' ? (
                  <label className="flex flex-col gap-1">
                    True distance
                    <Input
                      type="number"
                      step="any"
                      min="0"
                      value={trueSize.length}
                      onChange={(event) => setTrueSize({ ...trueSize, length: event.target.value })}
                      className="w-28"
                      autoFocus
                    />
                  </label>
                ) : (
                  <>
                    <label className="flex flex-col gap-1">
                      Width (corner 1 to 2)
                      <Input
                        type="number"
                        step="any"
                        min="0"
                        value={trueSize.width}
                        onChange={(event) =>
                          setTrueSize({ ...trueSize, width: event.target.value })
                        }
                        className="w-24"
                        autoFocus
                      />
                    </label>
                    <label className="flex flex-col gap-1">
                      Height (2 to 3)
                      <Input
                        type="number"
                        step="any"
                        min="0"
                        value={trueSize.height}
                        onChange={(event) =>
                          setTrueSize({ ...trueSize, height: event.target.value })
                        }
                        className="w-24"
                      />
                    </label>
                  </>
                )}
                <label className="flex flex-col gap-1">
                  Unit
                  <Select
                    value={trueSize.unit}
                    onChange={(event) =>
                      setTrueSize({ ...trueSize, unit: event.target.value as 'mm' | 'in' })
                    }
                  >
                    <option value="mm">mm</option>
                    <option value="in">in</option>
                  </Select>
                </label>
                <Button
                  type="submit"
                  variant="secondary"
                  disabled={!madeCalibration}
                  busy={calibrate.isPending}
                >
                  Use this scale
                </Button>
              </form>
            ) : null}
            {reusable.length > 0 ? (
              <label className="flex flex-col gap-1">
                Reuse the scale of a still of the same size and port
                <Select
                  value=""
                  onChange={(event) => {
                    if (event.target.value)
                      calibrate.mutate({
                        imageId: image.id,
                        input: { fromImageId: event.target.value },
                      });
                  }}
                >
                  <option value="">Choose an image…</option>
                  {reusable.map((other) => (
                    <option key={other.id} value={other.id}>
                      {other.originalName}
                    </option>
                  ))}
                </Select>
              </label>
            ) : null}
            <label className="flex flex-col gap-1">
              Pick uncertainty (px a point)
              <Input
                type="number"
                min="0"
                max="50"
                step="0.5"
                value={pickUncertainty}
                onChange={(event) => setPickUncertainty(event.target.value)}
                className="w-24"
              />
            </label>
          </section>

          <section
            aria-labelledby="measurement-heading"
            className="flex flex-col gap-2 text-sm"
            aria-live="polite"
          >
            <h3 id="measurement-heading" className="font-semibold">
              Measurement and verdict
            </h3>
            {measurement?.error ? <Notice tone="error">{measurement.error}</Notice> : null}
            {measurement?.value ? (
              <dl className="grid grid-cols-2 gap-2">
                {measurement.value.lengthMm !== null ? (
                  <Figure
                    label="Length"
                    testId="live-length"
                    value={`${mm(measurement.value.lengthMm)} mm ± ${mm(measurement.value.uncertaintyMm)} (${mm(measurement.value.lengthMm / MM_PER_INCH, 4)} in)`}
                  />
                ) : null}
                {measurement.value.areaMm2 !== null ? (
                  <>
                    <Figure
                      label="Area"
                      testId="live-area"
                      value={`${mm(measurement.value.areaMm2, 2)} mm² ± ${mm(measurement.value.uncertaintyMm2, 2)} (${mm(measurement.value.areaMm2 / 645.16, 5)} in²)`}
                    />
                    <Figure
                      label="Perimeter"
                      value={`${mm(measurement.value.perimeterMm, 2)} mm`}
                    />
                    <Figure
                      label="Largest extent"
                      value={`${mm(measurement.value.maxExtentMm, 2)} mm`}
                    />
                  </>
                ) : null}
              </dl>
            ) : shape && shape.kind !== 'point' && !calibration ? (
              <p className="text-soot-600">Calibrate the image to measure on it.</p>
            ) : !shape ? (
              <p className="text-soot-600">
                Choose Line (L), Outline (O) or Point (P) and draw the damage.
              </p>
            ) : null}
            {verdict?.value ? (
              <div className="flex flex-col gap-1" data-testid="live-verdict">
                <VerdictBadge category={verdict.value.category} />
                <p>
                  <VerdictBasis evaluation={verdict.value} limitSet={limitSet} />
                </p>
                {verdict.value.indeterminate ? (
                  <Notice tone="caution">
                    Indeterminate: the value is{' '}
                    {verdictStyles[verdict.value.measuredCategory].label.toLowerCase()} but the
                    uncertainty reaches {verdictStyles[verdict.value.category].label.toLowerCase()}.
                    A re-measurement or a better view could settle it.
                  </Notice>
                ) : null}
              </div>
            ) : verdict?.error ? (
              <Notice tone="error">{verdict.error}</Notice>
            ) : limitSet === null ? (
              <Notice tone="caution">
                No limit-set revision is in force for this engine model: every finding goes to
                review.
              </Notice>
            ) : null}
            <p className="text-xs text-soot-600">
              {limitSet ? `Judged against ${limitSet.title} (revision ${limitSet.revision}). ` : ''}
              {cautions.limits}
            </p>
          </section>

          <form
            aria-labelledby="finding-heading"
            className="flex flex-col gap-2 text-sm"
            noValidate
            onSubmit={(event) => void submit(event)}
          >
            <h3 id="finding-heading" className="font-semibold">
              Record the finding
            </h3>
            <FindingFields form={form} rows={rows} candidates={candidates.data} />
            {elsewhere && tagged ? (
              <Notice tone="caution" title="Not where the still is tagged">
                This still is tagged {tagged.label} {tagPosition}; the finding would be recorded on{' '}
                {row?.label ?? details.row} {details.position}.{' '}
                {elsewhereConfirmed === elsewhere ? (
                  'You said it belongs there.'
                ) : (
                  <button
                    type="button"
                    className="font-medium underline"
                    onClick={() => setElsewhereConfirmed(elsewhere)}
                  >
                    Record it on {row?.label ?? details.row} {details.position} all the same
                  </button>
                )}
              </Notice>
            ) : null}
            {formError ? <Notice tone="error">{formError}</Notice> : null}
            <p role="status" className="text-sm text-soot-700">
              {announcement}
            </p>
            <Button
              type="submit"
              busy={record.isPending}
              disabled={
                !state.complete ||
                !shape ||
                !located ||
                (elsewhere !== null && elsewhereConfirmed !== elsewhere)
              }
            >
              Record finding
            </Button>
          </form>
        </div>
      ) : null}
    </div>
  );
}
