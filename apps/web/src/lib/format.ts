import { dayWords } from '@emberline/domain/dates';
import { MM_PER_INCH, MM2_PER_SQUARE_INCH } from '@emberline/domain/units';
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

const fixed = (value: number, digits: number) =>
  value.toLocaleString('en-GB', { minimumFractionDigits: digits, maximumFractionDigits: digits });

/** A length in mm with its uncertainty, and the same in inches: 1.30 mm ± 0.09 (0.0512 in ± 0.0034). */
export function formatLength(mm: number, uncertainty: number | null): string {
  const inches = mm / MM_PER_INCH;
  const inchUncertainty = uncertainty === null ? null : uncertainty / MM_PER_INCH;
  return `${fixed(mm, 2)} mm${uncertainty === null ? '' : ` ± ${fixed(uncertainty, 2)}`} (${fixed(inches, 4)} in${inchUncertainty === null ? '' : ` ± ${fixed(inchUncertainty, 4)}`})`;
}

/** An area in mm² with its uncertainty, and the same in square inches. */
export function formatArea(mm2: number, uncertainty: number | null): string {
  const square = mm2 / MM2_PER_SQUARE_INCH;
  return `${fixed(mm2, 2)} mm²${uncertainty === null ? '' : ` ± ${fixed(uncertainty, 2)}`} (${fixed(square, 5)} in²)`;
}
