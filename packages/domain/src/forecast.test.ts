import { describe, expect, it } from 'vitest';
import { forecast } from './forecast';

const from = { date: '2026-03-01', csn: 12000, tsn: 24000 };

describe('forecast', () => {
  it('takes the earliest candidate date, whichever comes first', () => {
    const result = forecast({
      from,
      interval: { cycles: 500, hours: 1200, days: 180 },
      utilization: { cyclesPerDay: 4, hoursPerDay: 8 },
    });
    // cycles: 500 / 4 = 125 days; hours: 1200 / 8 = 150 days; calendar: 180 days.
    expect(result).toEqual({
      dueCsn: 12500,
      dueTsn: 25200,
      dueDate: '2026-07-04',
      governing: 'cycles',
      candidates: { cycles: '2026-07-04', hours: '2026-07-29', days: '2026-08-28' },
    });
  });

  it('floors a fractional number of days, keeping a quotient within 1e-9 of a whole number whole', () => {
    expect(
      forecast({
        from,
        interval: { cycles: 10, hours: null, days: null },
        utilization: { cyclesPerDay: 3, hoursPerDay: null },
      }).candidates.cycles,
    ).toBe('2026-03-04');
    // 0.3 / 0.1 is 2.9999999999999996 in floating point: still three days.
    expect(
      forecast({
        from,
        interval: { cycles: 0.3, hours: null, days: null },
        utilization: { cyclesPerDay: 0.1, hoursPerDay: null },
      }).candidates.cycles,
    ).toBe('2026-03-04');
  });

  it('breaks ties by cycles, then hours, then days', () => {
    const tie = forecast({
      from,
      interval: { cycles: 100, hours: 200, days: 50 },
      utilization: { cyclesPerDay: 2, hoursPerDay: 4 },
    });
    expect(tie.governing).toBe('cycles');
    const hoursAndDays = forecast({
      from,
      interval: { cycles: null, hours: 200, days: 50 },
      utilization: { cyclesPerDay: 2, hoursPerDay: 4 },
    });
    expect(hoursAndDays.governing).toBe('hours');
  });

  it('gives no candidate for a dimension without an interval or without utilization', () => {
    const result = forecast({
      from,
      interval: { cycles: 500, hours: 1000, days: null },
      utilization: { cyclesPerDay: 0, hoursPerDay: null },
    });
    expect(result).toMatchObject({
      dueCsn: 12500,
      dueTsn: 25000,
      dueDate: null,
      governing: null,
      candidates: { cycles: null, hours: null, days: null },
    });
  });

  it('counts calendar days across a leap day and a year end in UTC', () => {
    expect(
      forecast({
        from: { ...from, date: '2028-02-28' },
        interval: { cycles: null, hours: null, days: 2 },
        utilization: { cyclesPerDay: null, hoursPerDay: null },
      }).dueDate,
    ).toBe('2028-03-01');
    expect(
      forecast({
        from: { ...from, date: '2026-12-31' },
        interval: { cycles: null, hours: null, days: 1 },
        utilization: { cyclesPerDay: null, hoursPerDay: null },
      }).dueDate,
    ).toBe('2027-01-01');
  });
});
