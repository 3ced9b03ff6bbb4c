import { describe, expect, it } from 'vitest';
import { dailyUtilization, periodsOverlap } from './utilization';

describe('daily utilization', () => {
  it('averages the last 90 days of monthly increments', () => {
    const records = [
      { periodStart: '2026-01-01', periodEnd: '2026-01-31', cycles: 310, hours: 496 },
      { periodStart: '2026-02-01', periodEnd: '2026-02-28', cycles: 280, hours: 448 },
      { periodStart: '2026-03-01', periodEnd: '2026-03-31', cycles: 155, hours: 248 },
    ];
    // The window is 2026-01-01 … 2026-03-31: 90 days, all covered.
    const result = dailyUtilization(records);
    expect(result).toMatchObject({
      windowStart: '2026-01-01',
      windowEnd: '2026-03-31',
      coveredDays: 90,
    });
    expect(result.cyclesPerDay).toBeCloseTo((310 + 280 + 155) / 90, 12);
    expect(result.hoursPerDay).toBeCloseTo((496 + 448 + 248) / 90, 12);
  });

  it('counts a record straddling the window start in proportion to its days inside', () => {
    const records = [
      { periodStart: '2025-12-01', periodEnd: '2025-12-31', cycles: 310, hours: 500 },
      { periodStart: '2026-01-01', periodEnd: '2026-03-30', cycles: 890, hours: 1424 },
    ];
    // Window 2026-01-01 − 1 day = 2025-12-31 … 2026-03-30: one December day of 31 inside.
    const result = dailyUtilization(records);
    expect(result.windowStart).toBe('2025-12-31');
    expect(result.coveredDays).toBe(90);
    expect(result.cyclesPerDay).toBeCloseTo((10 + 890) / 90, 12);
  });

  it('divides by covered days, so a gap in the records is not read as days on the ground', () => {
    const result = dailyUtilization([
      { periodStart: '2026-03-01', periodEnd: '2026-03-10', cycles: 50, hours: 80 },
    ]);
    expect(result).toMatchObject({ coveredDays: 10, cyclesPerDay: 5, hoursPerDay: 8 });
  });

  it('has no figures without records', () => {
    expect(dailyUtilization([])).toEqual({
      cyclesPerDay: null,
      hoursPerDay: null,
      windowStart: null,
      windowEnd: null,
      coveredDays: 0,
    });
  });

  it('says when two periods share a day', () => {
    expect(
      periodsOverlap(
        { periodStart: '2026-01-01', periodEnd: '2026-01-31' },
        { periodStart: '2026-01-31', periodEnd: '2026-02-10' },
      ),
    ).toBe(true);
    expect(
      periodsOverlap(
        { periodStart: '2026-01-01', periodEnd: '2026-01-31' },
        { periodStart: '2026-02-01', periodEnd: '2026-02-10' },
      ),
    ).toBe(false);
  });
});
