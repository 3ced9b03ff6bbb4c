import { describe, expect, it } from 'vitest';
import { dueStatus, openRequirements, type DueInput, type DueInspection } from './due-status';

// A steady engine: 10 cycles and 20 hours a day, every day of 2026 recorded to 30 Nov.
const flown = (from: string, to: string) => {
  const days = (Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / 86_400_000 + 1;
  return [{ periodStart: from, periodEnd: to, cycles: 10 * days, hours: 20 * days }];
};

const inspection = (overrides: Partial<DueInspection> = {}): DueInspection => ({
  id: 'i1',
  date: '2026-10-01',
  csn: 5000,
  tsn: 9000,
  outcomeSignedAt: '2026-10-02T09:00:00.000Z',
  coverage: [
    { row: 'ngv', status: 'full', viewedPositions: [] },
    { row: 'blade', status: 'full', viewedPositions: [] },
  ],
  decisions: [],
  ...overrides,
});

const input = (overrides: Partial<DueInput> = {}): DueInput => ({
  today: '2026-12-03',
  rows: [{ key: 'ngv' }, { key: 'blade' }],
  standardInterval: { cycles: 3000, hours: 5000, days: 730 },
  engine: { status: 'installed', csn: 5600, tsn: 10200, tsnCsnAsOf: '2026-11-30', baseline: null },
  utilization: flown('2026-01-01', '2026-11-30'),
  inspections: [inspection()],
  awaitingBeyondLimits: false,
  soon: { days: 14, cycles: 50, hours: 100 },
  ...overrides,
});

const repeat = (position: number, cycles: number | null, hours: number | null = null) => ({
  findingId: `f${position}`,
  seriesId: `s${position}`,
  row: 'blade',
  position,
  decision: {
    kind: 'repeat-inspection' as const,
    repeatInterval: { cycles, hours, days: null },
  },
});

describe('due status (DESIGN §5.6)', () => {
  it('runs the standard interval from the last full inspection, cycles governing', () => {
    // From 1 Oct 2026 at CSN 5,000, TSN 9,000: 3,000 cycles at 10 a day = 300 days → 28 Jul 2027;
    // 5,000 hours at 20 a day = 250 days → 8 Jun 2027; 730 days → 30 Sep 2028 (2028 is a leap
    // year). Hours come first.
    const due = dueStatus(input());
    expect(due.nextInspection).toEqual({
      dueCsn: 8000,
      dueTsn: 14000,
      dueDate: '2027-06-08',
      governing: 'hours',
    });
    expect(due.governedBy).toEqual({
      kind: 'standard',
      row: 'ngv',
      position: null,
      inspectionId: 'i1',
    });
    // CSN now: 5,600 on 30 Nov plus 3 days at 10 a day.
    expect(due.csnNow).toBe(5630);
    expect(due.state).toBe('ok');
  });

  it('lets a repeat requirement govern, and each dimension in turn', () => {
    // 200 cycles from CSN 5,000 on 1 Oct at 10 a day: 20 days → 21 Oct 2026, passed: overdue.
    const cycles = dueStatus(
      input({ inspections: [inspection({ decisions: [repeat(12, 200)] })] }),
    );
    expect(cycles.governedBy).toMatchObject({ kind: 'repeat', row: 'blade', position: 12 });
    expect(cycles.nextInspection).toMatchObject({
      dueCsn: 5200,
      dueDate: '2026-10-21',
      governing: 'cycles',
    });
    expect(cycles.state).toBe('overdue');
    // 1,400 hours at 20 a day: 70 days → 10 Dec 2026, within 14 days: due soon.
    const hours = dueStatus(
      input({ inspections: [inspection({ decisions: [repeat(12, null, 1400)] })] }),
    );
    expect(hours.nextInspection).toMatchObject({
      dueTsn: 10400,
      dueDate: '2026-12-10',
      governing: 'hours',
    });
    expect(hours.state).toBe('due-soon');
    // Days alone: 60 days → 30 Nov 2026, before today.
    const days = dueStatus(
      input({
        inspections: [
          inspection({
            decisions: [
              {
                ...repeat(3, null),
                decision: {
                  kind: 'repeat-inspection',
                  repeatInterval: { cycles: null, hours: null, days: 60 },
                },
              },
            ],
          }),
        ],
      }),
    );
    expect(days.nextInspection).toMatchObject({ dueDate: '2026-11-30', governing: 'days' });
    expect(days.state).toBe('overdue');
  });

  it('turns overdue the day after the due date, and when CSN now reaches dueCsn', () => {
    // 70 days from 1 Oct 2026 → due 10 Dec 2026: due soon on the 10th, overdue on the 11th.
    const base = input({
      inspections: [
        inspection({
          decisions: [
            {
              ...repeat(12, null),
              decision: {
                kind: 'repeat-inspection',
                repeatInterval: { cycles: null, hours: null, days: 70 },
              },
            },
          ],
        }),
      ],
    });
    expect(dueStatus(base).nextInspection).toMatchObject({ dueDate: '2026-12-10' });
    expect(dueStatus({ ...base, today: '2026-12-10' }).state).toBe('due-soon');
    expect(dueStatus({ ...base, today: '2026-12-11' }).state).toBe('overdue');
    // 640 cycles → dueCsn 5,640, 64 days → 4 Dec; on 3 Dec CSN now is 5,630: due soon. Flown
    // more than the rates say (CSN 5,640 entered as of 30 Nov): overdue by CSN before the date.
    const byCsn = input({ inspections: [inspection({ decisions: [repeat(12, 640)] })] });
    expect(dueStatus(byCsn).nextInspection).toMatchObject({ dueCsn: 5640, dueDate: '2026-12-04' });
    expect(dueStatus(byCsn).state).toBe('due-soon');
    expect(dueStatus({ ...byCsn, engine: { ...byCsn.engine, csn: 5640 } }).state).toBe('overdue');
  });

  it('keeps an earlier repeat requirement open through a partial event inspection that did not view it', () => {
    const first = inspection({ decisions: [repeat(12, 400)] });
    const event = inspection({
      id: 'i2',
      date: '2026-11-01',
      csn: 5310,
      tsn: 9620,
      outcomeSignedAt: '2026-11-02T09:00:00.000Z',
      coverage: [{ row: 'blade', status: 'partial', viewedPositions: [1, 2, 3] }],
    });
    expect(openRequirements([first, event]).map((item) => item.position)).toEqual([12]);
    // Viewing position 12 closes it.
    const viewed = {
      ...event,
      coverage: [{ row: 'blade', status: 'partial' as const, viewedPositions: [12] }],
    };
    expect(openRequirements([first, viewed])).toEqual([]);
    // The requirement still governs from the first inspection: 400 cycles → CSN 5,400, 10 Nov.
    const due = dueStatus(input({ inspections: [first, event] }));
    expect(due.nextInspection).toMatchObject({ dueCsn: 5400, dueDate: '2026-11-10' });
  });

  it('dates a removal within N cycles, and one before the next flight at its outcome', () => {
    const within = dueStatus(
      input({
        inspections: [
          inspection({
            decisions: [
              {
                ...repeat(7, null),
                decision: {
                  kind: 'remove',
                  action: { kind: 'remove-within', cycles: 50, hours: null },
                },
              },
            ],
          }),
        ],
      }),
    );
    // 50 cycles at 10 a day from 1 Oct: 6 Oct 2026, CSN 5,050.
    expect(within.removal).toEqual({
      kind: 'remove-within',
      inspectionId: 'i1',
      dueCsn: 5050,
      dueTsn: null,
      dueDate: '2026-10-06',
    });
    expect(within.state).toBe('overdue');
    const now = dueStatus(
      input({
        inspections: [
          inspection({
            decisions: [
              {
                ...repeat(7, null),
                decision: {
                  kind: 'remove',
                  action: { kind: 'remove-before-next-flight', cycles: null, hours: null },
                },
              },
            ],
          }),
        ],
      }),
    );
    expect(now.removal).toMatchObject({ kind: 'remove-before-next-flight', dueDate: '2026-10-02' });
  });

  it('runs from the pre-fleet inspection alone, and is unknown with none or with stale utilization', () => {
    const preFleet = dueStatus(
      input({
        inspections: [],
        engine: {
          status: 'installed',
          csn: 5600,
          tsn: 10200,
          tsnCsnAsOf: '2026-11-30',
          baseline: { kind: 'pre-fleet', date: '2026-06-01', csn: 3700, tsn: 6400 },
        },
      }),
    );
    // 3,000 cycles from 1 Jun 2026 = 300 days → 28 Mar 2027; 5,000 hours = 250 days → 6 Feb 2027.
    expect(preFleet.nextInspection).toMatchObject({ dueDate: '2027-02-06', governing: 'hours' });
    expect(preFleet.governedBy).toMatchObject({ kind: 'standard', inspectionId: null });
    expect(preFleet.state).toBe('ok');
    const none = dueStatus(input({ inspections: [] }));
    expect(none.state).toBe('unknown');
    expect(none.reason).toMatch(/No inspection or earlier record of ngv, blade/);
    const stale = dueStatus(input({ utilization: flown('2026-01-01', '2026-10-15') }));
    expect(stale.state).toBe('unknown');
    expect(stale.reason).toMatch(/Utilization not recorded for more than 30 days/);
  });

  it('says in shop or awaiting disposition whatever else holds', () => {
    const base = input({ inspections: [inspection({ decisions: [repeat(12, 200)] })] });
    expect(dueStatus({ ...base, awaitingBeyondLimits: true }).state).toBe('awaiting-disposition');
    expect(dueStatus({ ...base, engine: { ...base.engine, status: 'in-shop' } }).state).toBe(
      'in-shop',
    );
  });
});
