import fc from 'fast-check';
import { linearRegression, linearRegressionLine, rSquared } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { trend } from '../../packages/domain/src/trend';

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
});
