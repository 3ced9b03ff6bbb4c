import { addDays, formatISO, parseISO } from 'date-fns';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { forecast } from '../../packages/domain/src/forecast';

describe('forecast dates against date-fns', () => {
  it('lands each candidate on the day date-fns addDays gives for floor(interval / daily use)', () => {
    fc.assert(
      fc.property(
        fc.date({
          min: new Date('2000-01-01T00:00:00Z'),
          max: new Date('2090-12-31T00:00:00Z'),
          noInvalidDate: true,
        }),
        fc.integer({ min: 1, max: 20_000 }),
        fc.double({ min: 0.1, max: 12, noNaN: true }),
        fc.integer({ min: 1, max: 3000 }),
        (start, cycles, perDay, days) => {
          const date = start.toISOString().slice(0, 10);
          const result = forecast({
            from: { date, csn: 0, tsn: 0 },
            interval: { cycles, hours: null, days },
            utilization: { cyclesPerDay: perDay, hoursPerDay: null },
          });
          const reference = (n: number) =>
            formatISO(addDays(parseISO(date), n), { representation: 'date' });
          expect(result.candidates.cycles).toBe(reference(Math.floor(cycles / perDay + 1e-9)));
          expect(result.candidates.days).toBe(reference(days));
        },
      ),
      { numRuns: 500 },
    );
  });
});
