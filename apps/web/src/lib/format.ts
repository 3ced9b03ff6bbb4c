import { dayWords } from '@emberline/domain/dates';
/** Hours with one decimal and thousands separated, as logbooks show them. */
export function formatHours(value: number): string {
  return value.toLocaleString('en-GB', { minimumFractionDigits: 1, maximumFractionDigits: 1 });
}

export function formatCount(value: number): string {
  return value.toLocaleString('en-GB', { maximumFractionDigits: 0 });
}

export function formatRate(value: number | null, unit: string): string {
  return value === null
    ? 'not enough records'
    : `${value.toLocaleString('en-GB', { maximumFractionDigits: 2, minimumFractionDigits: 2 })} ${unit}`;
}

/** A `YYYY-MM-DD` date as an unambiguous day: 14 Mar 2026 (the one format of the product). */
export function formatDate(value: string | null): string {
  return value ? dayWords(value) : '—';
}

/** A key of the domain (`leading-edge`, `coating-loss`) in words: leading edge, coating loss. */
export const formatKey = (key: string) => key.replace(/-/g, ' ');

/** A moment as people read it on a shared screen: 2 Dec 2026, 14:05 UTC. */
export function formatDateTime(value: string | null): string {
  if (!value) return '—';
  const at = new Date(value);
  const day = at.toLocaleDateString('en-GB', {
    day: 'numeric',
    month: 'short',
    year: 'numeric',
    timeZone: 'UTC',
  });
  const time = at.toLocaleTimeString('en-GB', {
    hour: '2-digit',
    minute: '2-digit',
    hour12: false,
    timeZone: 'UTC',
  });
  return `${day}, ${time} UTC`;
}
