import type { DailyUtilization } from '@emberline/contracts/fleet';
import { addDays, daysBetween } from './dates';

export interface UtilizationIncrement {
  periodStart: string;
  periodEnd: string;
  cycles: number;
  hours: number;
}

/** Days of a period, both ends included. */
function periodDays(start: string, end: string): number {
  return daysBetween(start, end) + 1;
}

/**
 * Daily utilization from increments (the cycles and hours flown in dated periods) over the
 * `windowDays` days that end on the last recorded day. A record that straddles the window start
 * counts in proportion to its days inside; the rates are per day of the window that records cover,
 * so a gap in the records does not read as days without flying.
 */
export function dailyUtilization(
  records: readonly UtilizationIncrement[],
  windowDays = 90,
): DailyUtilization {
  if (records.length === 0)
    return {
      cyclesPerDay: null,
      hoursPerDay: null,
      windowStart: null,
      windowEnd: null,
      coveredDays: 0,
    };
  const windowEnd = records.reduce(
    (latest, record) => (record.periodEnd > latest ? record.periodEnd : latest),
    records[0]!.periodEnd,
  );
  const windowStart = addDays(windowEnd, -(windowDays - 1));
  let cycles = 0;
  let hours = 0;
  let covered = 0;
  for (const record of records) {
    const start = record.periodStart > windowStart ? record.periodStart : windowStart;
    const end = record.periodEnd < windowEnd ? record.periodEnd : windowEnd;
    if (end < start) continue;
    const inside = periodDays(start, end);
    const share = inside / periodDays(record.periodStart, record.periodEnd);
    cycles += record.cycles * share;
    hours += record.hours * share;
    covered += inside;
  }
  return {
    cyclesPerDay: covered ? cycles / covered : null,
    hoursPerDay: covered ? hours / covered : null,
    windowStart,
    windowEnd,
    coveredDays: covered,
  };
}

/** Whether two periods share a day. */
export function periodsOverlap(
  a: { periodStart: string; periodEnd: string },
  b: { periodStart: string; periodEnd: string },
): boolean {
  return a.periodStart <= b.periodEnd && b.periodStart <= a.periodEnd;
}
