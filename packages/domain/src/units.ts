import type { LimitUnit } from '@emberline/contracts/limits';

/** 1 in = 25.4 mm exactly (NIST SP 811, appendix B). */
export const MM_PER_INCH = 25.4;
/** 1 in² = 645.16 mm² exactly (25.4²). */
export const MM2_PER_SQUARE_INCH = 645.16;

/**
 * Relative tolerance of every comparison with a limit and every floor of a quotient, so that a value
 * on a limit after an inch/mm conversion stays on it (0.762 mm against 0.030 in).
 */
export const RELATIVE_TOLERANCE = 1e-9;

/** How a unit is written where people read it: one spelling of square millimetres (mm²). */
export const unitSymbols: Record<LimitUnit, string> = {
  mm: 'mm',
  in: 'in',
  mm2: 'mm²',
  in2: 'in²',
  count: '',
};

/** A value measured in mm, mm² or as a count, expressed in a limit's unit. */
export function fromMillimetres(value: number, unit: LimitUnit): number {
  switch (unit) {
    case 'in':
      return value / MM_PER_INCH;
    case 'in2':
      return value / MM2_PER_SQUARE_INCH;
    default:
      return value;
  }
}

/** a ≤ b, allowing the relative tolerance. */
export function atMost(a: number, b: number): boolean {
  return a - b <= RELATIVE_TOLERANCE * Math.max(Math.abs(a), Math.abs(b));
}

/** a > b beyond the relative tolerance. */
export function exceeds(a: number, b: number): boolean {
  return !atMost(a, b);
}

/** floor(numerator / denominator), with a quotient within the tolerance of an integer taken as it. */
export function floorQuotient(numerator: number, denominator: number): number {
  const quotient = numerator / denominator;
  const nearest = Math.round(quotient);
  if (Math.abs(quotient - nearest) <= RELATIVE_TOLERANCE * Math.abs(quotient)) return nearest;
  return Math.floor(quotient);
}
