import type { EngineModelRow, EngineStatus } from '@emberline/contracts/fleet';
import { defaultZones } from '@emberline/contracts/fleet';
import { addDays, daysBetween } from '@emberline/domain/dates';
import { dailyUtilization } from '@emberline/domain/utilization';
import type { DbOrTx } from '../db/client';
import {
  bookings,
  engineModelRows,
  engineModels,
  engines,
  reportContacts,
  utilizationRecords,
} from '../db/schema';

// Everything here is invented for the demo: the model, its rows and ports, the engines, their
// serial numbers, registrations and utilization.

export const DEMO_MODEL_ID = 'model-vt300-v1';

const topClockwiseAft = {
  positionOne: "12 o'clock (top dead centre)",
  direction: 'clockwise',
  viewpoint: 'aft-looking-forward',
} as const;

const row = (
  key: string,
  label: string,
  kind: EngineModelRow['kind'],
  count: number,
  ports: string[],
): EngineModelRow => ({
  key,
  label,
  kind,
  count,
  numbering: topClockwiseAft,
  zones: defaultZones[kind],
  ports,
});

/** A two-spool turbofan: annular combustor, single-stage HPT, three-stage LPT. */
export const demoModelRows: EngineModelRow[] = [
  row('comb-liner', 'Combustor liner', 'combustor-liner', 18, ['BP-1', 'BP-2']),
  row('fuel-nozzles', 'Fuel nozzles', 'fuel-nozzle', 18, ['BP-1', 'BP-2']),
  row('hpt1-ngv', 'HPT stage 1 nozzle guide vanes', 'vane', 38, ['BP-2', 'BP-3']),
  row('hpt1-blade', 'HPT stage 1 blades', 'blade', 64, ['BP-3']),
  row('lpt1-ngv', 'LPT stage 1 nozzle guide vanes', 'vane', 48, ['BP-4']),
  row('lpt1-blade', 'LPT stage 1 blades', 'blade', 86, ['BP-4']),
  row('lpt2-ngv', 'LPT stage 2 nozzle guide vanes', 'vane', 54, ['BP-5']),
  row('lpt2-blade', 'LPT stage 2 blades', 'blade', 92, ['BP-5']),
  row('lpt3-ngv', 'LPT stage 3 nozzle guide vanes', 'vane', 60, ['BP-6']),
  row('lpt3-blade', 'LPT stage 3 blades', 'blade', 98, ['BP-6']),
];

interface DemoEngine {
  id: string;
  serialNumber: string;
  organisationId: string;
  registration: string | null;
  installedPosition: string | null;
  status: EngineStatus;
  csn: number;
  hoursPerCycle: number;
  cyclesPerDay: number;
  /** Months before the last complete month in which this engine stopped flying. */
  idleMonths: number;
  /** Utilization not entered for this many days (the due status cannot tell CSN now). */
  recordsStoppedDaysAgo?: number;
  /** Its pre-fleet inspection falls due (by cycles) this many days from the day the demo loads. */
  preFleetDueInDays?: number;
  /** Booked by the demo planner this many days from the day the demo loads. */
  bookedInDays?: number;
}

export const demoEngines: DemoEngine[] = [
  {
    id: 'engine-d0101',
    serialNumber: 'VT3-D0101',
    organisationId: 'org-corvid',
    registration: 'ZZ-CRA',
    installedPosition: '1',
    status: 'installed',
    csn: 14_210,
    hoursPerCycle: 1.6,
    cyclesPerDay: 5.2,
    idleMonths: 0,
    preFleetDueInDays: 280,
  },
  {
    id: 'engine-d0102',
    serialNumber: 'VT3-D0102',
    organisationId: 'org-corvid',
    registration: 'ZZ-CRA',
    installedPosition: '2',
    status: 'installed',
    csn: 13_980,
    hoursPerCycle: 1.6,
    cyclesPerDay: 5.2,
    idleMonths: 0,
    preFleetDueInDays: 10,
  },
  {
    id: 'engine-d0103',
    serialNumber: 'VT3-D0103',
    organisationId: 'org-corvid',
    registration: 'ZZ-CRB',
    installedPosition: '1',
    status: 'installed',
    csn: 9_455,
    hoursPerCycle: 1.4,
    cyclesPerDay: 6.1,
    idleMonths: 0,
    preFleetDueInDays: 400,
  },
  {
    id: 'engine-d0104',
    serialNumber: 'VT3-D0104',
    organisationId: 'org-corvid',
    registration: 'ZZ-CRB',
    installedPosition: '2',
    status: 'installed',
    csn: 11_032,
    hoursPerCycle: 1.4,
    cyclesPerDay: 6.1,
    idleMonths: 0,
    preFleetDueInDays: 90,
    bookedInDays: 45,
  },
  {
    id: 'engine-d0105',
    serialNumber: 'VT3-D0105',
    organisationId: 'org-corvid',
    registration: 'ZZ-CRC',
    installedPosition: '1',
    status: 'installed',
    csn: 21_740,
    hoursPerCycle: 1.9,
    cyclesPerDay: 4.3,
    idleMonths: 0,
    preFleetDueInDays: 200,
    recordsStoppedDaysAgo: 42,
  },
  {
    id: 'engine-d0106',
    serialNumber: 'VT3-D0106',
    organisationId: 'org-corvid',
    registration: null,
    installedPosition: null,
    status: 'in-shop',
    csn: 18_306,
    hoursPerCycle: 1.9,
    cyclesPerDay: 4.3,
    idleMonths: 1,
    preFleetDueInDays: 150,
  },
  {
    id: 'engine-d0201',
    serialNumber: 'VT3-D0201',
    organisationId: 'org-pellucid',
    registration: 'ZZ-PLA',
    installedPosition: '1',
    status: 'installed',
    csn: 7_120,
    hoursPerCycle: 2.1,
    cyclesPerDay: 3.6,
    idleMonths: 0,
    preFleetDueInDays: 320,
  },
  {
    id: 'engine-d0202',
    serialNumber: 'VT3-D0202',
    organisationId: 'org-pellucid',
    registration: 'ZZ-PLA',
    installedPosition: '2',
    status: 'installed',
    csn: 7_098,
    hoursPerCycle: 2.1,
    cyclesPerDay: 3.6,
    idleMonths: 0,
    preFleetDueInDays: 240,
  },
  {
    id: 'engine-d0203',
    serialNumber: 'VT3-D0203',
    organisationId: 'org-pellucid',
    registration: 'ZZ-PLB',
    installedPosition: '1',
    status: 'installed',
    csn: 16_455,
    hoursPerCycle: 1.7,
    cyclesPerDay: 4.8,
    idleMonths: 0,
    preFleetDueInDays: 360,
  },
  {
    id: 'engine-d0204',
    serialNumber: 'VT3-D0204',
    organisationId: 'org-pellucid',
    registration: null,
    installedPosition: null,
    status: 'removed',
    csn: 24_870,
    hoursPerCycle: 1.7,
    cyclesPerDay: 4.8,
    idleMonths: 2,
    preFleetDueInDays: 120,
  },
];

export const demoContacts = [
  {
    id: 'contact-corvid-records',
    organisationId: 'org-corvid',
    name: 'Oona Brightwater',
    email: 'records@corvid.demo.test',
    role: 'Technical records',
  },
  {
    id: 'contact-corvid-powerplant',
    organisationId: 'org-corvid',
    name: 'Lars Fenwick',
    email: 'powerplant@corvid.demo.test',
    role: 'Powerplant manager',
  },
  {
    id: 'contact-pellucid-assets',
    organisationId: 'org-pellucid',
    name: 'Signe Halloran',
    email: 'assets@pellucid.demo.test',
    role: 'Asset manager',
  },
];

/** The first day of the month of `date` (YYYY-MM-DD), shifted by `months`. */
function monthStart(date: string, months: number): string {
  const [year, month] = date.split('-').map(Number) as [number, number];
  const shifted = new Date(Date.UTC(year, month - 1 + months, 1));
  return shifted.toISOString().slice(0, 10);
}

/**
 * Twelve monthly increments ending with the last complete month before `today`, then the days of
 * this month up to yesterday, deterministic per engine; an engine whose records stopped has none
 * after that day.
 */
export function demoUtilization(
  engine: DemoEngine,
  today: string,
): { periodStart: string; periodEnd: string; cycles: number; hours: number }[] {
  let seed = [...engine.id].reduce((sum, char) => sum * 31 + char.charCodeAt(0), 7) >>> 0;
  const jitter = () => {
    seed = (seed * 1664525 + 1013904223) >>> 0;
    return 0.9 + (seed / 2 ** 32) * 0.2;
  };
  const periods: { periodStart: string; periodEnd: string }[] = [];
  for (let back = 12; back >= 1 + engine.idleMonths; back -= 1)
    periods.push({
      periodStart: monthStart(today, -back),
      periodEnd: addDays(monthStart(today, -back + 1), -1),
    });
  const thisMonth = monthStart(today, 0);
  if (engine.idleMonths === 0 && thisMonth < today)
    periods.push({ periodStart: thisMonth, periodEnd: addDays(today, -1) });
  const lastDay = engine.recordsStoppedDaysAgo
    ? addDays(today, -engine.recordsStoppedDaysAgo)
    : null;
  const months = [];
  for (const { periodStart, periodEnd: fullEnd } of periods) {
    if (lastDay && periodStart > lastDay) break;
    const periodEnd = lastDay && fullEnd > lastDay ? lastDay : fullEnd;
    const days = daysBetween(periodStart, periodEnd) + 1;
    const cycles = Math.round(engine.cyclesPerDay * days * jitter());
    months.push({
      periodStart,
      periodEnd,
      cycles,
      hours: Math.round(cycles * engine.hoursPerCycle * jitter() * 10) / 10,
    });
  }
  return months;
}

/**
 * The demo engine's last hot-section inspection before it joined the fleet, placed so that the
 * invented standard interval (3,000 cycles, 6,000 hours or 730 days) falls due when the demo wants
 * it: `dueInDays` days from today by cycles, at the engine's own 90-day rate.
 */
function demoPreFleet(
  engine: DemoEngine,
  history: ReturnType<typeof demoUtilization>,
  today: string,
): { date: string; csn: number; tsn: number } | null {
  if (engine.preFleetDueInDays === undefined) return null;
  const rate = dailyUtilization(history).cyclesPerDay ?? engine.cyclesPerDay;
  const last = history[history.length - 1]!;
  const span = Math.floor(DEMO_STANDARD_INTERVAL.cycles / rate) - engine.preFleetDueInDays;
  const date = addDays(today, -span);
  const cyclesSince = Math.round(rate * daysBetween(date, last.periodEnd));
  return {
    date,
    csn: engine.csn - cyclesSince,
    tsn: Math.round((engine.csn - cyclesSince) * engine.hoursPerCycle * 10) / 10,
  };
}

/** The demo model's routine interval: invented, no engine manual's figure. */
export const DEMO_STANDARD_INTERVAL = { cycles: 3000, hours: 6000, days: 730 };

export function loadDemoFleet(tx: DbOrTx, now: Date): void {
  const today = now.toISOString().slice(0, 10);
  tx.insert(engineModels)
    .values({
      id: DEMO_MODEL_ID,
      name: 'Vantor VT-300 (demo model)',
      version: 1,
      notes:
        'Invented two-spool turbofan for the demo scenario. Rows, counts and ports are made up.',
      standardInterval: DEMO_STANDARD_INTERVAL,
      createdAt: now,
    })
    .run();
  tx.insert(engineModelRows)
    .values(demoModelRows.map((row, sequence) => ({ modelId: DEMO_MODEL_ID, sequence, ...row })))
    .run();
  tx.insert(reportContacts)
    .values(demoContacts.map((contact) => ({ ...contact, createdAt: now })))
    .run();
  for (const engine of demoEngines) {
    const history = demoUtilization(engine, today);
    const last = history[history.length - 1]!;
    tx.insert(engines)
      .values({
        id: engine.id,
        serialNumber: engine.serialNumber,
        modelId: DEMO_MODEL_ID,
        organisationId: engine.organisationId,
        installedPosition: engine.installedPosition,
        registration: engine.registration,
        tsn: Math.round(engine.csn * engine.hoursPerCycle * 10) / 10,
        csn: engine.csn,
        tsnCsnAsOf: last.periodEnd,
        status: engine.status,
        preFleetInspection: demoPreFleet(engine, history, today),
        createdAt: now,
      })
      .run();
    if (engine.bookedInDays !== undefined)
      tx.insert(bookings)
        .values({
          engineId: engine.id,
          plannedDate: addDays(today, engine.bookedInDays),
          note: 'Line station slot, borescope kit B (invented)',
          dueDateAtBooking:
            engine.preFleetDueInDays === undefined
              ? null
              : addDays(today, engine.preFleetDueInDays),
          bookedBy: 'user-planner',
          bookedAt: now,
        })
        .run();
    tx.insert(utilizationRecords)
      .values(
        history.map((record, index) => ({
          id: `${engine.id}-u${index}`,
          engineId: engine.id,
          ...record,
          source: 'demo' as const,
          createdAt: now,
        })),
      )
      .run();
  }
}
