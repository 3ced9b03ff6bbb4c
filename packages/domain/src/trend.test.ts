import { describe, expect, it } from 'vitest';
import { trend } from './trend';

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
