import type { TrendRequest, TrendResult } from '@emberline/contracts/trend';
import type { Rule } from '@emberline/contracts/limits';
import { DomainError } from './errors';
import { MM2_PER_SQUARE_INCH, MM_PER_INCH } from './units';

/**
 * Least-squares trend of one damage series (DESIGN §5.4): value = a + b·csn, r² from three points,
 * and, while the damage grows (b > 0), the CSN at which it reaches the limit and the cycles left.
 */
export function trend({ points, limit }: TrendRequest): TrendResult {
  const n = points.length;
  if (new Set(points.map((point) => point.csn)).size < 2) {
    throw new DomainError('a trend needs inspections at two different CSN at least', ['points']);
  }
  const meanX = points.reduce((sum, point) => sum + point.csn, 0) / n;
  const meanY = points.reduce((sum, point) => sum + point.value, 0) / n;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (const { csn, value } of points) {
    sxx += (csn - meanX) ** 2;
    sxy += (csn - meanX) * (value - meanY);
    syy += (value - meanY) ** 2;
  }
  const slope = sxy / sxx;
  const intercept = meanY - slope * meanX;
  let r2: number | null = null;
  if (n >= 3) {
    const residual = points.reduce(
      (sum, { csn, value }) => sum + (value - (intercept + slope * csn)) ** 2,
      0,
    );
    // Every value equal: the flat line fits them exactly.
    r2 = syy === 0 ? 1 : 1 - residual / syy;
  }
  const latest = Math.max(...points.map((point) => point.csn));
  const projected = slope > 0 ? (limit - intercept) / slope : null;
  return {
    n,
    intercept,
    slopePerCycle: slope,
    r2,
    projectedCsnAtLimit: projected,
    cyclesRemaining: projected === null ? null : projected - latest,
  };
}

/**
 * The trend warning of one damage series (DESIGN §5.6): the §5.4 projection of value plus
 * uncertainty reaches the outer limit before the CSN expected at the next due date. Returns the
 * cycles from the last measurement to the limit, or null when there is nothing to warn of (fewer
 * than two CSN, not growing, or the limit comes later).
 */
export function trendWarning(
  points: readonly { csn: number; value: number; uncertainty: number }[],
  limit: number,
  expectedCsn: number,
): { cyclesRemaining: number; projectedCsnAtLimit: number } | null {
  if (new Set(points.map((point) => point.csn)).size < 2) return null;
  const result = trend({
    points: points.map((point) => ({ csn: point.csn, value: point.value + point.uncertainty })),
    limit,
  });
  if (result.projectedCsnAtLimit === null || result.cyclesRemaining === null) return null;
  if (result.projectedCsnAtLimit >= expectedCsn) return null;
  return {
    cyclesRemaining: result.cyclesRemaining,
    projectedCsnAtLimit: result.projectedCsnAtLimit,
  };
}

/** A measured point of a damage series, in mm (or mm² for an area rule). */
export interface SeriesPoint {
  csn: number;
  value: number;
  uncertainty: number;
}

/**
 * What a damage series is projected against (DESIGN §5.4, §5.6): the outer limit of the rule that
 * judged its latest finding (the repeat limit, else the serviceable one) in mm or mm², and the
 * measurements of the series in that measure. Null for a rule without such a limit.
 */
export function seriesAgainstRule(
  rule: Pick<Rule, 'measure' | 'unit' | 'repeatMax' | 'serviceableMax'>,
  points: readonly {
    csn: number;
    lengthMm: number | null;
    areaMm2: number | null;
    uncertaintyMm: number | null;
    uncertaintyMm2: number | null;
  }[],
): { area: boolean; limit: number; points: SeriesPoint[] } | null {
  const outer = rule.repeatMax ?? rule.serviceableMax;
  if (outer === null) return null;
  const area = rule.measure === 'area';
  const limit =
    rule.unit === 'in'
      ? outer * MM_PER_INCH
      : rule.unit === 'in2'
        ? outer * MM2_PER_SQUARE_INCH
        : outer;
  return {
    area,
    limit,
    points: points.flatMap((point) => {
      const value = area ? point.areaMm2 : point.lengthMm;
      const uncertainty = (area ? point.uncertaintyMm2 : point.uncertaintyMm) ?? 0;
      return value === null ? [] : [{ csn: point.csn, value, uncertainty }];
    }),
  };
}
