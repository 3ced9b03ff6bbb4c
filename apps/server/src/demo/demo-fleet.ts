import type { EngineModelRow, EngineStatus } from '@emberline/contracts/fleet';
import { defaultZones } from '@emberline/contracts/fleet';
import { addDays } from '@emberline/domain/dates';
import type { DbOrTx } from '../db/client';
import {
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

/** Twelve monthly increments ending with the last complete month before `today`, deterministic per engine. */
export function demoUtilization(
  engine: DemoEngine,
  today: string,
): { periodStart: string; periodEnd: string; cycles: number; hours: number }[] {
  let seed = [...engine.id].reduce((sum, char) => sum * 31 + char.charCodeAt(0), 7) >>> 0;
  const jitter = () => {
    seed = (seed * 1664525 + 1013904223) >>> 0;
    return 0.9 + (seed / 2 ** 32) * 0.2;
  };
  const months = [];
  for (let back = 12; back >= 1 + engine.idleMonths; back -= 1) {
    const periodStart = monthStart(today, -back);
    const periodEnd = addDays(monthStart(today, -back + 1), -1);
    const days = Number(periodEnd.slice(8, 10));
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

export function loadDemoFleet(tx: DbOrTx, now: Date): void {
  const today = now.toISOString().slice(0, 10);
  tx.insert(engineModels)
    .values({
      id: DEMO_MODEL_ID,
      name: 'Vantor VT-300 (demo model)',
      version: 1,
      notes:
        'Invented two-spool turbofan for the demo scenario. Rows, counts and ports are made up.',
      // Invented routine interval: no real engine manual's figure.
      standardInterval: { cycles: 3000, hours: 6000, days: 730 },
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
        createdAt: now,
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
