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

/** A `YYYY-MM-DD` date as people read it everywhere in the product: 1 Dec 2026. */
export function dayWords(date: string): string {
  return new Date(`${date.slice(0, 10)}T00:00:00Z`).toLocaleDateString('en-GB', {
    day: 'numeric',
    month: 'short',
    year: 'numeric',
    timeZone: 'UTC',
  });
}
