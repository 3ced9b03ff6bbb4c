import { useState } from 'react';
import { cautions } from '@emberline/contracts/cautions';
import {
  coverageStatusLabels,
  findingDetailsSchema,
  type CoverageStatus,
  type Finding,
  type InspectionOutcome,
  type RowCoverage,
} from '@emberline/contracts/findings';
import type { EngineModelRow } from '@emberline/contracts/fleet';
import { categories, type Category } from '@emberline/contracts/limits';
import { clockOfPositionOne, stageRing } from '@emberline/drawings/stage-ring';
import { Button } from '../../../components/ui/button';
import { Input } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { SvgDrawing } from '../../../components/ui/svg-drawing';
import {
  useRecordCoverage,
  useSeriesCandidates,
  useUpdateFinding,
  useVoidFinding,
} from '../api/findings';
import { applyServerErrors, useZodForm } from '../../../lib/form';
import { formatKey } from '../../../lib/format';
import { FindingFields } from './finding-fields';
import { formatPositions, parsePositions } from '../lib/live';
import { reasonLabels } from '../lib/reason-labels';
import { VerdictBadge } from '../../../components/ui/verdict-badge';

const rank = (category: Category) => categories.indexOf(category);

function describeInterval(interval: InspectionOutcome['repeatInterval']): string {
  if (!interval) return '';
  return [
    interval.cycles !== null ? `${interval.cycles} cycles` : null,
    interval.hours !== null ? `${interval.hours} hours` : null,
    interval.days !== null ? `${interval.days} days` : null,
  ]
    .filter(Boolean)
    .join(' or ');
}

const actionWords = {
  'remove-before-next-flight': 'remove before the next flight',
  'remove-within': 'remove within',
  'remove-at-next-shop-visit': 'remove at the next shop visit',
} as const;

export function OutcomeSummary({ outcome }: { outcome: InspectionOutcome }) {
  return (
    <div className="flex flex-col gap-2 text-sm" data-testid="inspection-outcome">
      <div className="flex flex-wrap items-center gap-2">
        <span className="font-medium">Outcome so far:</span>
        <VerdictBadge category={outcome.category} />
        <span className="text-soot-700">
          {categories
            .filter((category) => outcome.counts[category])
            .map((category) => `${outcome.counts[category]} ${category.replace('-', ' ')}`)
            .join(' · ') || 'no findings'}
        </span>
      </div>
      {outcome.repeatInterval ? (
        <p>
          Repeat inspection within {describeInterval(outcome.repeatInterval)} (the earliest limit
          governs).
        </p>
      ) : null}
      {outcome.beyondActions.map((action) => (
        <p
          key={`${action.kind}-${action.cycles}-${action.hours}`}
          className="font-medium text-red-900"
        >
          Beyond limits: {actionWords[action.kind]}
          {action.kind === 'remove-within'
            ? ` ${describeInterval({ cycles: action.cycles, hours: action.hours, days: null })}`
            : ''}
        </p>
      ))}
      {outcome.coverageGaps.length > 0 ? (
        <Notice tone="caution">
          Not fully viewed, with no reason given: {outcome.coverageGaps.join(', ')}. The outcome is
          at best review until each gap is viewed or explained.
        </Notice>
      ) : null}
      <p className="text-xs text-soot-600">
        {outcome.limitSet
          ? `Limits: ${outcome.limitSet.title}, revision ${outcome.limitSet.revision}${outcome.limitSet.invented ? ' — invented for the demo' : ''}. `
          : 'No limit-set revision in force. '}
        {cautions.limits}
      </p>
    </div>
  );
}

function CoverageForm({
  inspectionId,
  row,
  coverage,
}: {
  inspectionId: string;
  row: EngineModelRow;
  coverage: RowCoverage;
}) {
  const save = useRecordCoverage(inspectionId);
  const [status, setStatus] = useState<CoverageStatus>(
    coverage.recorded ? coverage.status : 'full',
  );
  const [positions, setPositions] = useState(formatPositions(coverage.viewedPositions));
  const [noDamage, setNoDamage] = useState(coverage.noDamageFound);
  const [reason, setReason] = useState(coverage.reason);
  const parsed = status === 'partial' ? parsePositions(positions, row.count) : null;
  return (
    <form
      className="flex flex-col gap-2 text-sm"
      aria-label={`Coverage of ${row.label}`}
      onSubmit={(event) => {
        event.preventDefault();
        if (parsed?.error) return;
        save.mutate({
          row: row.key,
          input: { status, viewedPositions: parsed?.value ?? [], noDamageFound: noDamage, reason },
        });
      }}
    >
      <fieldset className="flex flex-wrap gap-3">
        <legend className="mb-1 font-medium">Viewed</legend>
        {(['full', 'partial', 'none'] as const).map((option) => (
          <label key={option} className="flex items-center gap-1">
            <input
              type="radio"
              name={`coverage-${row.key}`}
              checked={status === option}
              onChange={() => setStatus(option)}
            />
            {coverageStatusLabels[option]}
          </label>
        ))}
      </fieldset>
      {status === 'partial' ? (
        <label className="flex flex-col gap-1">
          Positions viewed (such as 1-20, 25)
          <Input
            value={positions}
            onChange={(event) => setPositions(event.target.value)}
            aria-invalid={Boolean(parsed?.error)}
          />
          {parsed?.error ? <span className="text-red-700">{parsed.error}</span> : null}
        </label>
      ) : null}
      {status !== 'full' ? (
        <label className="flex flex-col gap-1">
          Why it was not fully viewed
          <Input
            value={reason}
            onChange={(event) => setReason(event.target.value)}
            placeholder="Port blocked, rotor could not be turned, …"
          />
        </label>
      ) : null}
      {status !== 'none' ? (
        <label className="flex items-center gap-2">
          <input
            type="checkbox"
            checked={noDamage}
            onChange={(event) => setNoDamage(event.target.checked)}
          />
          No damage found on this row
        </label>
      ) : null}
      {save.error ? <Notice tone="error">{save.error.message}</Notice> : null}
      <Button type="submit" variant="secondary" busy={save.isPending} className="w-fit">
        Save coverage of {row.label}
      </Button>
    </form>
  );
}

/** Corrects what was entered about a recorded finding; its drawing and scale stay as recorded. */
function FindingEditForm({
  finding,
  rows,
  onDone,
}: {
  finding: Finding;
  rows: EngineModelRow[];
  onDone: () => void;
}) {
  const update = useUpdateFinding(finding.inspectionId);
  const [formError, setFormError] = useState('');
  const form = useZodForm(findingDetailsSchema, {
    defaultValues: {
      row: finding.row,
      position: finding.position,
      zone: finding.zone,
      damage: finding.damage,
      method: finding.method,
      lengthMm: finding.method === 'probe' ? finding.lengthMm : null,
      areaMm2: finding.method === 'probe' ? finding.areaMm2 : null,
      uncertaintyMm: finding.method === 'probe' ? finding.uncertaintyMm : null,
      uncertaintyMm2: finding.method === 'probe' ? finding.uncertaintyMm2 : null,
      widthMm: finding.widthMm,
      depthMm: finding.depthMm,
      count: finding.count,
      notes: finding.notes,
      previousFindingId: finding.previousFindingId,
    },
  });
  const [row, position, damage] = form.watch(['row', 'position', 'damage']);
  const candidates = useSeriesCandidates(
    finding.inspectionId,
    Number.isInteger(position) && position >= 1 ? { row, position, damage } : null,
  );
  const onSubmit = form.handleSubmit((details) => {
    setFormError('');
    update.mutate(
      {
        id: finding.id,
        input: {
          ...details,
          imageId: finding.imageId,
          shape: finding.shape,
          calibration: finding.calibration?.calibration ?? null,
          calibrationImageId: finding.calibration?.imageId ?? null,
          pickUncertaintyPx: finding.pickUncertaintyPx,
        },
      },
      { onSuccess: onDone, onError: (error) => setFormError(applyServerErrors(form, error)) },
    );
  });
  return (
    <form
      className="flex flex-col gap-2 rounded border border-soot-200 bg-soot-50 p-2"
      aria-label={`Correct F${finding.number}`}
      noValidate
      onSubmit={(event) => void onSubmit(event)}
    >
      <FindingFields form={form} rows={rows} candidates={candidates.data} />
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      <p className="text-xs text-soot-600">
        The drawing and its scale stay as recorded; to redraw, void this finding and record it
        again. The whole inspection is judged again when you save.
      </p>
      <div className="flex gap-2">
        <Button type="submit" variant="secondary" busy={update.isPending}>
          Save F{finding.number}
        </Button>
        <Button type="button" variant="ghost" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

function FindingItem({
  finding,
  rows,
  editable,
  inspectionId,
  onOpen,
}: {
  finding: Finding;
  rows: EngineModelRow[];
  editable: boolean;
  inspectionId: string;
  onOpen: (finding: Finding) => void;
}) {
  const voiding = useVoidFinding(inspectionId);
  const [reason, setReason] = useState('');
  const [asking, setAsking] = useState(false);
  const [correcting, setCorrecting] = useState(false);
  const evaluation = finding.evaluation;
  return (
    <li
      className={`flex flex-col gap-1 rounded border border-soot-200 p-2 text-sm ${finding.status === 'void' ? 'opacity-60' : ''}`}
      data-testid="finding-item"
    >
      <div className="flex flex-wrap items-center gap-2">
        <button
          type="button"
          className="font-semibold text-ember-800 hover:underline"
          onClick={() => onOpen(finding)}
        >
          F{finding.number}
        </button>
        <span>
          position {finding.position}, {formatKey(finding.zone)}, {formatKey(finding.damage)}
        </span>
        {finding.status === 'void' ? (
          <span className="font-medium">Void: {finding.voidReason}</span>
        ) : evaluation ? (
          <VerdictBadge category={evaluation.category} />
        ) : null}
      </div>
      <p className="font-mono text-xs" data-testid="finding-figures">
        {finding.lengthMm !== null
          ? `${finding.lengthMm.toFixed(3)} mm ± ${finding.uncertaintyMm?.toFixed(3)}`
          : ''}
        {finding.areaMm2 !== null
          ? `${finding.areaMm2.toFixed(2)} mm² ± ${finding.uncertaintyMm2?.toFixed(2)}`
          : ''}
        {finding.depthMm !== null ? ` depth ${finding.depthMm} mm` : ''}
        {finding.count !== null ? ` count ${finding.count}` : ''}
        {finding.method === 'probe' ? ' (probe)' : ''}
      </p>
      {evaluation && finding.status === 'recorded' ? (
        <p className="text-xs text-soot-700">
          {evaluation.ruleId ? `Rule ${evaluation.ruleId}: ` : ''}
          {evaluation.reasons.map((item) => reasonLabels[item]).join('; ')}
          {evaluation.indeterminate
            ? ' · indeterminate: a re-measurement or a better view could settle it'
            : ''}
          {finding.previousFindingId ? ' · continues an earlier finding' : ''}
        </p>
      ) : null}
      {editable && finding.status === 'recorded' && correcting ? (
        <FindingEditForm finding={finding} rows={rows} onDone={() => setCorrecting(false)} />
      ) : null}
      {editable && finding.status === 'recorded' && !correcting ? (
        asking ? (
          <form
            className="flex flex-wrap items-end gap-2"
            onSubmit={(event) => {
              event.preventDefault();
              voiding.mutate({ id: finding.id, reason });
            }}
          >
            <label className="flex flex-col gap-1 text-xs">
              Why is F{finding.number} void?
              <Input value={reason} onChange={(event) => setReason(event.target.value)} />
            </label>
            <Button type="submit" variant="danger" busy={voiding.isPending}>
              Void F{finding.number}
            </Button>
            {voiding.error ? <Notice tone="error">{voiding.error.message}</Notice> : null}
          </form>
        ) : (
          <div className="flex gap-4 text-xs">
            <button
              type="button"
              className="text-ember-800 hover:underline"
              onClick={() => setCorrecting(true)}
            >
              Correct F{finding.number}…
            </button>
            <button
              type="button"
              className="text-red-800 hover:underline"
              onClick={() => setAsking(true)}
            >
              Void (recorded by mistake)…
            </button>
          </div>
        )
      ) : null}
    </li>
  );
}

/** Per row: the stage ring (click a position to filter), the findings, and the row's coverage. */
export function FindingsPanel({
  inspectionId,
  rows,
  findings,
  coverage,
  editable,
  onOpen,
}: {
  inspectionId: string;
  rows: EngineModelRow[];
  findings: Finding[];
  coverage: RowCoverage[];
  editable: boolean;
  onOpen: (finding: Finding) => void;
}) {
  const [filter, setFilter] = useState<Record<string, number | null>>({});
  return (
    <div className="flex flex-col gap-6">
      {rows.map((row) => {
        const onRow = findings.filter((finding) => finding.row === row.key);
        const verdicts = new Map<number, Category>();
        for (const finding of onRow) {
          const category = finding.status === 'recorded' ? finding.evaluation?.category : undefined;
          if (!category) continue;
          const current = verdicts.get(finding.position);
          if (!current || rank(category) > rank(current)) verdicts.set(finding.position, category);
        }
        const rowCoverage = coverage.find((item) => item.row === row.key);
        const viewed = new Set(rowCoverage?.viewedPositions ?? []);
        const unviewed = new Set(
          rowCoverage?.status === 'full'
            ? []
            : Array.from({ length: row.count }, (_, index) => index + 1).filter(
                (position) => !viewed.has(position),
              ),
        );
        const selected = filter[row.key] ?? null;
        const shown = onRow
          .filter((finding) => selected === null || finding.position === selected)
          .sort((a, b) => a.position - b.position || a.number - b.number);
        return (
          <section
            key={row.key}
            aria-labelledby={`row-${row.key}`}
            className="grid gap-4 border-t border-soot-200 pt-4 lg:grid-cols-[360px_1fr]"
            data-testid={`row-${row.key}`}
          >
            <div>
              <SvgDrawing
                drawing={stageRing({
                  count: row.count,
                  positionOneClock: clockOfPositionOne(row.numbering.positionOne),
                  direction: row.numbering.direction,
                  viewpoint: formatKey(row.numbering.viewpoint),
                  title: row.label,
                  verdicts,
                  unviewed: rowCoverage?.recorded || rowCoverage ? unviewed : new Set(),
                  selected,
                })}
                svgProps={{
                  className: 'h-auto w-full max-w-[360px] cursor-pointer',
                  onClick: (event) => {
                    const target = (event.target as Element).closest('[data-position]');
                    const position = target ? Number(target.getAttribute('data-position')) : null;
                    setFilter({ ...filter, [row.key]: position === selected ? null : position });
                  },
                }}
              />
              <label className="mt-2 flex items-center gap-2 text-sm">
                Show position
                <Input
                  type="number"
                  min={1}
                  max={row.count}
                  value={selected ?? ''}
                  onChange={(event) =>
                    setFilter({
                      ...filter,
                      [row.key]: event.target.value ? Number(event.target.value) : null,
                    })
                  }
                  className="w-24"
                  aria-label={`Show the findings of one position of ${row.label}`}
                />
                {selected !== null ? (
                  <button
                    type="button"
                    className="text-ember-800 hover:underline"
                    onClick={() => setFilter({ ...filter, [row.key]: null })}
                  >
                    All positions
                  </button>
                ) : null}
              </label>
            </div>
            <div className="flex flex-col gap-3">
              <h3 id={`row-${row.key}`} className="font-semibold">
                {row.label}{' '}
                <span className="text-sm font-normal text-soot-600">
                  {rowCoverage
                    ? `· ${rowCoverage.recorded ? coverageStatusLabels[rowCoverage.status] : 'Coverage not recorded'}`
                    : ''}
                  {rowCoverage?.status === 'partial'
                    ? ` (${formatPositions(rowCoverage.viewedPositions)})`
                    : ''}
                  {rowCoverage?.noDamageFound ? ' · no damage found' : ''}
                  {rowCoverage?.reason ? ` · ${rowCoverage.reason}` : ''}
                </span>
              </h3>
              {shown.length > 0 ? (
                <ul className="flex flex-col gap-2">
                  {shown.map((finding) => (
                    <FindingItem
                      key={finding.id}
                      finding={finding}
                      rows={rows}
                      editable={editable}
                      inspectionId={inspectionId}
                      onOpen={onOpen}
                    />
                  ))}
                </ul>
              ) : (
                <p className="text-sm text-soot-600">
                  {selected !== null
                    ? `No findings at position ${selected}.`
                    : 'No findings on this row.'}
                </p>
              )}
              {editable && rowCoverage ? (
                <CoverageForm
                  key={rowCoverage.updatedAt ?? 'new'}
                  inspectionId={inspectionId}
                  row={row}
                  coverage={rowCoverage}
                />
              ) : null}
            </div>
          </section>
        );
      })}
    </div>
  );
}
