import type { DueState, PlanningItem } from '@emberline/contracts/planning';
import { addDays } from '@emberline/domain/dates';
import { removalKindWords } from '@emberline/domain/decision-words';
import { formatCount, formatDate } from '../../../lib/format';

export type CalendarView = 'month' | 'week';

/** Monday of the week of a `YYYY-MM-DD` day. */
function mondayOf(day: string): string {
  const weekday = (new Date(`${day}T00:00:00Z`).getUTCDay() + 6) % 7;
  return addDays(day, -weekday);
}

const monthStart = (day: string) => `${day.slice(0, 7)}-01`;
function monthEnd(day: string): string {
  const [year, month] = day.split('-').map(Number) as [number, number];
  return new Date(Date.UTC(year, month, 0)).toISOString().slice(0, 10);
}
export function shiftMonth(day: string, months: number): string {
  const [year, month] = day.split('-').map(Number) as [number, number];
  return new Date(Date.UTC(year, month - 1 + months, 1)).toISOString().slice(0, 10);
}
export const monthWords = (day: string) =>
  new Date(`${day}T00:00:00Z`).toLocaleDateString('en-GB', {
    month: 'long',
    year: 'numeric',
    timeZone: 'UTC',
  });
export const weekdayWords = ['Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat', 'Sun'];

/** The days a view shows: whole weeks, Monday first. */
export function calendarDays(view: CalendarView, anchor: string): string[] {
  const first = view === 'month' ? mondayOf(monthStart(anchor)) : mondayOf(anchor);
  const last = view === 'month' ? addDays(mondayOf(monthEnd(anchor)), 6) : addDays(first, 6);
  const days: string[] = [];
  for (let day = first; day <= last; day = addDays(day, 1)) days.push(day);
  return days;
}

interface Entry {
  engineId: string;
  serialNumber: string;
  state: DueState;
  kind: 'inspection' | 'removal';
  words: string;
}

/** What falls due on each day: the next inspections and the removals of the engines listed. */
export function entriesByDay(items: readonly PlanningItem[]): Map<string, Entry[]> {
  const days = new Map<string, Entry[]>();
  const add = (day: string, entry: Entry) => days.set(day, [...(days.get(day) ?? []), entry]);
  for (const item of items) {
    const base = { engineId: item.engineId, serialNumber: item.serialNumber, state: item.state };
    const next = item.nextInspection;
    if (next?.dueDate)
      add(next.dueDate, {
        ...base,
        kind: 'inspection',
        words: `Inspection due${next.dueCsn !== null ? ` (CSN ${formatCount(next.dueCsn)})` : ''}${item.booking ? `, booked for ${formatDate(item.booking.plannedDate)}` : ', not booked'}`,
      });
    if (item.removal?.dueDate)
      add(item.removal.dueDate, {
        ...base,
        kind: 'removal',
        words: removalKindWords[item.removal.kind],
      });
  }
  return days;
}
