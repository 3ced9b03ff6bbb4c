import { describe, expect, it } from 'vitest';
import { trend, trendWarning } from './trend';

describe('trend', () => {
  it('fits a growing crack and projects where it meets the limit', () => {
    // Exact line value = 1 + 0.001 · csn through three inspections.
    const result = trend({
      points: [
        { csn: 0, value: 1 },
        { csn: 1000, value: 2 },
        { csn: 2000, value: 3 },
      ],
      limit: 5,
    });
    expect(result.n).toBe(3);
    expect(result.intercept).toBeCloseTo(1, 12);
    expect(result.slopePerCycle).toBeCloseTo(0.001, 15);
    expect(result.r2).toBeCloseTo(1, 12);
    expect(result.projectedCsnAtLimit).toBeCloseTo(4000, 9);
    expect(result.cyclesRemaining).toBeCloseTo(2000, 9);
  });

  it('gives r² only from three points', () => {
    expect(
      trend({
        points: [
          { csn: 100, value: 1 },
          { csn: 200, value: 1.5 },
        ],
        limit: 3,
      }).r2,
    ).toBeNull();
  });

  it('says zero or less remain once the projection is at or past the limit', () => {
    const result = trend({
      points: [
        { csn: 0, value: 1 },
        { csn: 1000, value: 3 },
      ],
      limit: 2,
    });
    expect(result.cyclesRemaining).toBeLessThanOrEqual(0);
  });

  it('projects nothing for damage that is not growing', () => {
    expect(
      trend({
        points: [
          { csn: 0, value: 2 },
          { csn: 1000, value: 2 },
          { csn: 2000, value: 2 },
        ],
        limit: 5,
      }),
    ).toMatchObject({ slopePerCycle: 0, r2: 1, projectedCsnAtLimit: null, cyclesRemaining: null });
    expect(
      trend({
        points: [
          { csn: 0, value: 3 },
          { csn: 1000, value: 2 },
        ],
        limit: 5,
      }).projectedCsnAtLimit,
    ).toBeNull();
  });

  it('refuses fewer than two distinct CSN', () => {
    expect(() =>
      trend({
        points: [
          { csn: 500, value: 1 },
          { csn: 500, value: 2 },
        ],
        limit: 5,
      }),
    ).toThrowError(/two different CSN/);
  });
});

describe('trend warning (DESIGN §5.6)', () => {
  // Hand-worked: value + uncertainty 1.0, 1.2, 1.4 at CSN 1,000, 1,100, 1,200 lie on
  // 0.002 mm a cycle from -1.0 mm: 1.5 mm is reached at CSN 1,250, 50 cycles after the last.
  const points = [
    { csn: 1000, value: 0.9, uncertainty: 0.1 },
    { csn: 1100, value: 1.1, uncertainty: 0.1 },
    { csn: 1200, value: 1.3, uncertainty: 0.1 },
  ];
  it('warns when the limit comes before the next due CSN, with the cycles left', () => {
    const warning = trendWarning(points, 1.5, 1300);
    expect(warning?.projectedCsnAtLimit).toBeCloseTo(1250, 9);
    expect(warning?.cyclesRemaining).toBeCloseTo(50, 9);
  });
  it('says nothing when the next inspection comes first, or the damage does not grow', () => {
    expect(trendWarning(points, 1.5, 1240)).toBeNull();
    expect(
      trendWarning(
        points.map((point) => ({ ...point, value: 1 })),
        1.5,
        9999,
      ),
    ).toBeNull();
    expect(trendWarning([points[0]!], 1.5, 9999)).toBeNull();
  });
});
