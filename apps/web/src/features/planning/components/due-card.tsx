import { cautions } from '@emberline/contracts/cautions';
import type { EngineDue } from '@emberline/contracts/planning';
import { actionWords, intervalWords, removalKindWords } from '@emberline/domain/decision-words';
import { Link } from 'react-router-dom';
import { DueStateBadge } from '../../../components/ui/due-state-badge';
import { LoadingLine } from '../../../components/ui/page';
import { Notice } from '../../../components/ui/notice';
import { formatCount, formatDate, formatHours } from '../../../lib/format';
import { useEngineDue } from '../api/planning';
import { BookingForm } from './booking-form';
import { DueMoveNote } from './due-move-note';

const dimensionWords = { cycles: 'cycles', hours: 'hours', days: 'calendar days' } as const;

function governedWords(due: EngineDue, rowLabel: (key: string) => string): string {
  const governed = due.governedBy;
  if (!governed) return '';
  const interval = intervalWords(due.interval);
  return governed.kind === 'repeat'
    ? `the repeat inspection of ${rowLabel(governed.row ?? '')} ${governed.position ?? ''} (within ${interval})`
    : `the standard interval for ${rowLabel(governed.row ?? '')} (${interval})${governed.inspectionId ? '' : ', from the inspection before the engine joined the fleet'}`;
}

/**
 * When the engine is next due: the state in words and shape, the due date, CSN and TSN with the
 * dimension that governs, what governs it and the interval used, the removal and the open
 * requirements, with CSN and TSN now as projected.
 */
export function DueCard({
  engineId,
  serialNumber,
  rowLabel,
  canBook,
  asReleased = false,
}: {
  engineId: string;
  serialNumber: string;
  rowLabel: (key: string) => string;
  canBook: boolean;
  /** The owner's view: computed from released inspections only, which the card says. */
  asReleased?: boolean;
}) {
  const due = useEngineDue(engineId);
  if (due.isPending) return <LoadingLine />;
  if (due.error) return <Notice tone="error">{due.error.message}</Notice>;
  const data = due.data;
  const next = data.nextInspection;
  return (
    <div className="flex flex-col gap-3 text-sm" data-testid="due-card">
      <div className="flex flex-wrap items-center gap-3">
        <DueStateBadge state={data.state} />
        <span>{data.reason}</span>
      </div>
      {asReleased ? (
        <p className="text-soot-700">
          As of the latest released inspection: an inspection still in review counts once it is
          released.
        </p>
      ) : null}
      {next ? (
        <dl className="grid gap-x-6 gap-y-2 sm:grid-cols-3">
          <div>
            <dt className="text-xs uppercase tracking-wide text-soot-600">Next inspection due</dt>
            <dd className="font-medium">
              {formatDate(next.dueDate)}
              {next.governing ? ` (by ${dimensionWords[next.governing]})` : ''}
            </dd>
          </div>
          <div>
            <dt className="text-xs uppercase tracking-wide text-soot-600">Due at CSN / TSN</dt>
            <dd className="font-medium">
              {next.dueCsn !== null ? formatCount(next.dueCsn) : '—'} /{' '}
              {next.dueTsn !== null ? `${formatHours(next.dueTsn)} h` : '—'}
            </dd>
          </div>
          <div>
            <dt className="text-xs uppercase tracking-wide text-soot-600">
              CSN / TSN now (projected)
            </dt>
            <dd className="font-medium">
              {data.csnNow !== null ? formatCount(data.csnNow) : '—'} /{' '}
              {data.tsnNow !== null ? `${formatHours(data.tsnNow)} h` : '—'}
            </dd>
          </div>
        </dl>
      ) : null}
      {data.lastMove ? <DueMoveNote move={data.lastMove} /> : null}
      {data.governedBy ? (
        <p>
          Governed by {governedWords(data, rowLabel)}
          {data.governedBy.inspectionId ? (
            <>
              {' '}
              from{' '}
              <Link
                to={`/inspections/${data.governedBy.inspectionId}`}
                className="text-ember-800 underline"
              >
                its inspection
              </Link>
            </>
          ) : null}
          .
        </p>
      ) : null}
      {data.removal ? (
        <p className="font-medium text-red-900">
          Removal: {removalKindWords[data.removal.kind]}
          {data.removal.dueDate ? `, due ${formatDate(data.removal.dueDate)}` : ''}
          {data.removal.dueCsn !== null ? ` or at CSN ${formatCount(data.removal.dueCsn)}` : ''}.
        </p>
      ) : null}
      {data.trendWarnings.length > 0 ? (
        <Notice tone="error" title="Limit reached before the next inspection">
          {data.trendWarnings
            .map(
              (warning) =>
                `A damage series is projected to reach its limit ${warning.cyclesRemaining > 0 ? `in about ${formatCount(warning.cyclesRemaining)} cycles` : 'already'}, before the CSN of the next inspection due.`,
            )
            .join(' ')}{' '}
          The projection is a straight line through the measurements with their uncertainty, not a
          prediction: the engineer decides.
        </Notice>
      ) : null}
      {data.requirements.length > 0 ? (
        <div>
          <h3 className="font-medium">Open requirements</h3>
          <ul className="list-inside list-disc">
            {data.requirements.map((requirement) => (
              <li key={`${requirement.findingId}-${requirement.kind}`}>
                {rowLabel(requirement.row)} {requirement.position}:{' '}
                {requirement.kind === 'repeat'
                  ? `repeat inspection within ${intervalWords(requirement.interval)}`
                  : requirement.action
                    ? actionWords(requirement.action)
                    : 'removal'}{' '}
                (inspection of {formatDate(requirement.inspectionDate)})
              </li>
            ))}
          </ul>
        </div>
      ) : null}
      {canBook ? (
        <BookingForm engineId={engineId} serialNumber={serialNumber} due={data} />
      ) : data.booking ? (
        <p>
          Booked for {formatDate(data.booking.plannedDate)}: {data.booking.note}
        </p>
      ) : null}
      <p className="text-xs text-soot-600">
        Due dates follow the signed decisions and the utilization recorded; the dates from rates are
        projections. {cautions.short}
      </p>
    </div>
  );
}
