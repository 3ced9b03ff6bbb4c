import { addDays, differenceInCalendarDays, formatISO, parseISO } from 'date-fns';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { dueStatus } from '../../packages/domain/src/due-status';

const iso = (date: Date) => formatISO(date, { representation: 'date' });

describe('due status against date-fns', () => {
  it('dates a days-only repeat requirement where date-fns addDays does, and turns overdue the day after', () => {
    fc.assert(
      fc.property(
        fc.date({
          min: new Date('2001-01-01T00:00:00Z'),
          max: new Date('2080-12-31T00:00:00Z'),
          noInvalidDate: true,
        }),
        fc.integer({ min: 1, max: 2000 }),
        (start, days) => {
          const date = start.toISOString().slice(0, 10);
          const due = iso(addDays(parseISO(date), days));
          const status = (today: string) =>
            dueStatus({
              today,
              rows: [{ key: 'blade' }],
              standardInterval: null,
              engine: {
                status: 'installed',
                csn: 1000,
                tsn: 2000,
                tsnCsnAsOf: today,
                baseline: null,
              },
              // Recorded up to today at no flying: no cycle or hour dimension can fall due.
              utilization: [{ periodStart: today, periodEnd: today, cycles: 0, hours: 0 }],
              inspections: [
                {
                  id: 'i',
                  date,
                  csn: 1000,
                  tsn: 2000,
                  outcomeSignedAt: `${date}T12:00:00.000Z`,
                  coverage: [{ row: 'blade', status: 'full', viewedPositions: [] }],
                  decisions: [
                    {
                      findingId: 'f',
                      seriesId: 's',
                      row: 'blade',
                      position: 1,
                      decision: {
                        kind: 'repeat-inspection',
                        repeatInterval: { cycles: null, hours: null, days },
                      },
                    },
                  ],
                },
              ],
              awaitingBeyondLimits: false,
              soon: { days: 14, cycles: 50, hours: 100 },
            });
          const onTheDay = status(due);
          expect(onTheDay.nextInspection?.dueDate).toBe(due);
          expect(onTheDay.state).toBe('due-soon');
          const dayAfter = iso(addDays(parseISO(due), 1));
          expect(differenceInCalendarDays(parseISO(dayAfter), parseISO(due))).toBe(1);
          expect(status(dayAfter).state).toBe('overdue');
        },
      ),
      { numRuns: 200 },
    );
  });
});
