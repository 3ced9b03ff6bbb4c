const DAY_MS = 86_400_000;

/** Adds whole days to a `YYYY-MM-DD` date, in UTC. */
export function addDays(date: string, days: number): string {
  const start = Date.parse(`${date}T00:00:00Z`);
  return new Date(start + days * DAY_MS).toISOString().slice(0, 10);
}

/** Whole days from `from` to `to`, both `YYYY-MM-DD` in UTC. */
export function daysBetween(from: string, to: string): number {
  return Math.round((Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / DAY_MS);
}

// One formatter for the product's day format: building one per call costs more than the rest of
// a due status.
const dayFormat = new Intl.DateTimeFormat('en-GB', {
  day: 'numeric',
  month: 'short',
  year: 'numeric',
  timeZone: 'UTC',
});

/** A `YYYY-MM-DD` date as people read it everywhere in the product: 1 Dec 2026. */
export function dayWords(date: string): string {
  return dayFormat.format(new Date(`${date.slice(0, 10)}T00:00:00Z`));
}

const countFormat = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 0 });

/** A count of cycles or hours as people read it: 12,242 (rounded to the whole). */
export function countWords(value: number): string {
  return countFormat.format(Math.round(value));
}
