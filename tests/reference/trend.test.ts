import fc from 'fast-check';
import { linearRegression, linearRegressionLine, rSquared } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { trend, trendWarning } from '../../packages/domain/src/trend';

describe('trend fits against simple-statistics', () => {
  it('agrees on intercept, slope and r² (linearRegression, rSquared)', () => {
    const points = fc
      .uniqueArray(fc.integer({ min: 0, max: 40_000 }), { minLength: 3, maxLength: 12 })
      .chain((csns) =>
        fc.tuple(
          ...csns.map((csn) =>
            fc
              .integer({ min: 0, max: 2000 })
              .map((hundredths) => ({ csn, value: hundredths / 100 })),
          ),
        ),
      );
    fc.assert(
      fc.property(points, (list) => {
        const ours = trend({ points: list, limit: 25 });
        const data = list.map(({ csn, value }) => [csn, value]);
        const { m, b } = linearRegression(data);
        expect(ours.slopePerCycle).toBeCloseTo(m, 9);
        expect(ours.intercept).toBeCloseTo(b, 6);
        const varies = new Set(list.map((p) => p.value)).size > 1;
        if (varies) expect(ours.r2!).toBeCloseTo(rSquared(data, linearRegressionLine({ m, b })), 6);
      }),
      { numRuns: 300 },
    );
  });

  it('warns exactly when the simple-statistics line through value + uncertainty reaches the limit before the CSN expected', () => {
    const series = fc
      .uniqueArray(fc.integer({ min: 0, max: 20_000 }), { minLength: 2, maxLength: 8 })
      .chain((csns) =>
        fc.tuple(
          fc.tuple(
            ...csns.map((csn) =>
              fc.record({
                csn: fc.constant(csn),
                value: fc.integer({ min: 0, max: 300 }).map((tenths) => tenths / 100),
                uncertainty: fc.integer({ min: 0, max: 10 }).map((hundredths) => hundredths / 100),
              }),
            ),
          ),
          fc.integer({ min: 0, max: 40_000 }),
        ),
      );
    fc.assert(
      fc.property(series, ([points, expectedCsn]) => {
        const limit = 2.5;
        const data = points.map((point) => [point.csn, point.value + point.uncertainty]);
        const { m, b } = linearRegression(data);
        const warning = trendWarning(points, limit, expectedCsn);
        // simple-statistics: the CSN at which b + m·csn reaches the limit, when the line grows.
        const atLimit = m > 1e-12 ? (limit - b) / m : null;
        if (atLimit === null || Math.abs(atLimit - expectedCsn) < 1e-6) return;
        expect(warning !== null).toBe(atLimit < expectedCsn);
        if (warning) {
          expect(warning.projectedCsnAtLimit).toBeCloseTo(atLimit, 4);
          const latest = Math.max(...points.map((point) => point.csn));
          expect(warning.cyclesRemaining).toBeCloseTo(atLimit - latest, 4);
        }
      }),
      { numRuns: 300 },
    );
  });
});
