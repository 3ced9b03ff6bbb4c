import { addDays } from '@emberline/domain/dates';
import { Link } from 'react-router-dom';
import { DueStateBadge } from '../../../components/ui/due-state-badge';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { formatDate } from '../../../lib/format';
import {
  calendarDays,
  entriesByDay,
  monthWords,
  shiftMonth,
  weekdayWords,
  type CalendarView,
} from '../lib/calendar';

export type { CalendarView };
import { usePlanning, usePlanningBetween } from '../api/planning';
import type { BoardFilters } from './planning-board';

/**
 * The planning board as a calendar (month or week): each engine on the day its next inspection
 * falls due, and on the day of its removal; the same engines and dates as the list, filtered
 * alike.
 */
export function PlanningCalendar({
  filters,
  view,
  anchor,
  today,
  onMove,
}: {
  filters: BoardFilters;
  view: CalendarView;
  anchor: string;
  today: string;
  onMove: (anchor: string) => void;
}) {
  const days = calendarDays(view, anchor);
  const from = days[0]!;
  const to = days.at(-1)!;
  const board = usePlanningBetween({ ...filters, from, to });
  // Engines overdue since before the days shown would otherwise not be seen from this view.
  const overdue = usePlanning({ ...filters, state: 'overdue', pageSize: 200 });
  const earlier = (overdue.data?.items ?? []).filter(
    (item) => (item.nextInspection?.dueDate ?? item.removal?.dueDate ?? to) < from,
  );
  const entries = entriesByDay(board.data ?? []);
  const title =
    view === 'month' ? monthWords(anchor) : `Week of ${formatDate(from)} to ${formatDate(to)}`;
  const step = (direction: 1 | -1) =>
    onMove(view === 'month' ? shiftMonth(anchor, direction) : addDays(anchor, 7 * direction));
  return (
    <section className="flex flex-col gap-3" aria-label={`Calendar, ${title}`}>
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 className="text-lg font-semibold">{title}</h2>
        <div className="flex gap-2">
          <Button variant="secondary" onClick={() => step(-1)}>
            {view === 'month' ? 'Previous month' : 'Previous week'}
          </Button>
          <Button variant="secondary" onClick={() => onMove(today)}>
            Today
          </Button>
          <Button variant="secondary" onClick={() => step(1)}>
            {view === 'month' ? 'Next month' : 'Next week'}
          </Button>
        </div>
      </div>
      {board.error ? <Notice tone="error">{board.error.message}</Notice> : null}
      {earlier.length > 0 ? (
        <Notice tone="error" title="Overdue from before these days">
          <ul className="flex flex-wrap gap-x-4 gap-y-1">
            {earlier.map((item) => (
              <li key={item.engineId}>
                <Link to={`/fleet/${item.engineId}`} className="font-mono underline">
                  {item.serialNumber}
                </Link>{' '}
                due {formatDate(item.nextInspection?.dueDate ?? item.removal?.dueDate ?? null)}
              </li>
            ))}
          </ul>
        </Notice>
      ) : null}
      <div
        className="grid grid-cols-1 gap-px overflow-hidden rounded-lg border border-soot-200 bg-soot-200 sm:grid-cols-7"
        aria-busy={board.isFetching || undefined}
      >
        {weekdayWords.map((name) => (
          <div
            key={name}
            className="hidden bg-soot-50 px-2 py-1 text-xs font-semibold uppercase tracking-wide text-soot-600 sm:block"
            aria-hidden
          >
            {name}
          </div>
        ))}
        {days.map((day) => {
          const outside = view === 'month' && day.slice(0, 7) !== anchor.slice(0, 7);
          const list = entries.get(day) ?? [];
          return (
            <div
              key={day}
              className={`flex min-h-24 flex-col gap-1 p-2 ${outside ? 'bg-soot-50 text-soot-500' : 'bg-white'} ${day === today ? 'ring-2 ring-inset ring-ember-600' : ''}`}
              data-day={day}
              data-testid="calendar-day"
            >
              <span className="text-xs font-semibold">
                {formatDate(day)}
                {day === today ? ' (today)' : ''}
              </span>
              <ul className="flex flex-col gap-1">
                {list.map((entry) => (
                  <li
                    key={`${entry.engineId}-${entry.kind}`}
                    className={`flex flex-col gap-0.5 rounded border px-1.5 py-1 text-xs ${entry.kind === 'removal' ? 'border-red-700 bg-red-50' : 'border-soot-200'}`}
                    data-testid="calendar-entry"
                    data-engine={entry.serialNumber}
                    data-kind={entry.kind}
                  >
                    <Link
                      to={`/fleet/${entry.engineId}`}
                      className="font-mono font-semibold text-ember-800 underline"
                    >
                      {entry.serialNumber}
                    </Link>
                    <DueStateBadge state={entry.state} />
                    <span>{entry.words}</span>
                  </li>
                ))}
              </ul>
            </div>
          );
        })}
      </div>
      {board.data && entries.size === 0 ? (
        <p className="text-sm text-soot-600">
          Nothing falls due {view === 'month' ? 'this month' : 'this week'} for these filters.
        </p>
      ) : null}
    </section>
  );
}
