import {
  eachDayOfInterval,
  endOfMonth,
  endOfWeek,
  format,
  startOfMonth,
  startOfWeek,
} from 'date-fns';
import { describe, expect, it } from 'vitest';
import type { PlanningItem } from '@emberline/contracts/planning';
import { calendarDays, entriesByDay } from './calendar';

// Reference: date-fns builds the same grids (weeks from Monday, ISO 8601).
const reference = (start: Date, end: Date) =>
  eachDayOfInterval({
    start: startOfWeek(start, { weekStartsOn: 1 }),
    end: endOfWeek(end, { weekStartsOn: 1 }),
  }).map((day) => format(day, 'yyyy-MM-dd'));

describe('planning calendar days', () => {
  for (const anchor of ['2026-12-03', '2027-02-14', '2026-03-01', '2028-02-29'])
    it(`shows whole weeks around the month of ${anchor}, and the week of it`, () => {
      const day = new Date(`${anchor}T12:00:00`);
      expect(calendarDays('month', anchor)).toEqual(reference(startOfMonth(day), endOfMonth(day)));
      expect(calendarDays('week', anchor)).toEqual(reference(day, day));
    });

  it('puts each engine on the day of its next inspection and of its removal', () => {
    const item = {
      engineId: 'e1',
      serialNumber: 'VT3-X0001',
      state: 'overdue',
      nextInspection: { dueDate: '2026-12-01', dueCsn: 9442, dueTsn: null, governing: 'cycles' },
      removal: {
        kind: 'remove-before-next-flight',
        dueDate: '2026-12-04',
        dueCsn: null,
        dueTsn: null,
        inspectionId: 'i1',
      },
      booking: null,
    } as unknown as PlanningItem;
    const days = entriesByDay([item]);
    expect([...days.keys()].sort()).toEqual(['2026-12-01', '2026-12-04']);
    expect(days.get('2026-12-01')![0]).toMatchObject({
      kind: 'inspection',
      words: 'Inspection due (CSN 9,442), not booked',
    });
    expect(days.get('2026-12-04')![0]).toMatchObject({
      kind: 'removal',
      words: 'Remove before the next flight',
    });
  });
});
