import type {
  ForecastDimension,
  ForecastRequest,
  ForecastResult,
} from '@emberline/contracts/forecast';
import { addDays } from './dates';
import { floorQuotient } from './units';

const order: ForecastDimension[] = ['cycles', 'hours', 'days'];

/**
 * When a repeat inspection falls due (DESIGN §5.3): dueCsn and dueTsn, and the earliest of the
 * candidate dates of each dimension ("whichever comes first"), from the date, CSN and TSN of the
 * inspection and the engine's daily utilization. A dimension without an interval or without
 * utilization has no candidate; ties go to cycles, then hours, then days.
 */
export function forecast({ from, interval, utilization }: ForecastRequest): ForecastResult {
  const candidate = (amount: number | null, perDay: number | null): string | null =>
    amount === null || perDay === null || perDay <= 0
      ? null
      : addDays(from.date, floorQuotient(amount, perDay));
  const candidates = {
    cycles: candidate(interval.cycles, utilization.cyclesPerDay),
    hours: candidate(interval.hours, utilization.hoursPerDay),
    days: interval.days === null ? null : addDays(from.date, Math.floor(interval.days)),
  };
  let governing: ForecastDimension | null = null;
  for (const dimension of order) {
    const date = candidates[dimension];
    if (date !== null && (governing === null || date < candidates[governing]!))
      governing = dimension;
  }
  return {
    dueCsn: interval.cycles === null ? null : from.csn + interval.cycles,
    dueTsn: interval.hours === null ? null : from.tsn + interval.hours,
    dueDate: governing ? candidates[governing] : null,
    governing,
    candidates,
  };
}
