import type { Interval } from '@emberline/contracts/limits';
import type {
  Baseline,
  Due,
  DueState,
  EngineDue,
  Requirement,
} from '@emberline/contracts/planning';
import type { Decision } from '@emberline/contracts/review';
import { addDays, countWords, dayWords, daysBetween } from './dates';
import { forecast } from './forecast';
import { dailyUtilization, type UtilizationIncrement } from './utilization';

/** A dispositioned or released inspection as the due status reads it. */
export interface DueInspection {
  id: string;
  date: string;
  csn: number;
  tsn: number;
  /** When its current outcome was signed (ISO): the last tie-break of the order. */
  outcomeSignedAt: string;
  coverage: { row: string; status: 'full' | 'partial' | 'none'; viewedPositions: number[] }[];
  /** The current decisions of its outcome. */
  decisions: {
    findingId: string;
    seriesId: string;
    row: string;
    position: number;
    decision: Decision;
  }[];
}

export interface DueInput {
  /** Today in the installation's time zone, `YYYY-MM-DD`. */
  today: string;
  rows: readonly { key: string }[];
  standardInterval: Interval | null;
  engine: {
    status: 'installed' | 'removed' | 'in-shop';
    csn: number;
    tsn: number;
    tsnCsnAsOf: string;
    /** The pre-fleet inspection, or the shop release that replaced it (which closes what came before). */
    baseline: (Baseline & { kind: 'pre-fleet' | 'shop-release' }) | null;
  };
  utilization: readonly UtilizationIncrement[];
  inspections: readonly DueInspection[];
  /** A submitted inspection holds a beyond-limits verdict. */
  awaitingBeyondLimits: boolean;
  soon: { days: number; cycles: number; hours: number };
  /** A utilization record older than this many days makes the state unknown. */
  staleAfterDays?: number;
}

export type Candidate = Due & {
  kind: 'standard' | 'repeat';
  row: string | null;
  position: number | null;
  inspectionId: string | null;
  interval: Interval;
};

const byOrder = (a: DueInspection, b: DueInspection) =>
  a.date.localeCompare(b.date) ||
  a.csn - b.csn ||
  a.outcomeSignedAt.localeCompare(b.outcomeSignedAt);

/**
 * The open requirements after every inspection in order (DESIGN §5.6): each current repeat or
 * remove decision opens one on its row and position; a later inspection closes those of the
 * positions it viewed (a full row, or the positions listed) and opens its own. What an event or
 * partial inspection did not view stays open.
 */
export function openRequirements(inspections: readonly DueInspection[]): Requirement[] {
  let open: Requirement[] = [];
  for (const inspection of [...inspections].sort(byOrder)) {
    for (const viewed of inspection.coverage) {
      if (viewed.status === 'none') continue;
      const positions = new Set(viewed.viewedPositions);
      open = open.filter(
        (requirement) =>
          requirement.row !== viewed.row ||
          (viewed.status === 'partial' && !positions.has(requirement.position)),
      );
    }
    for (const item of inspection.decisions) {
      if (item.decision.kind === 'serviceable') continue;
      open.push({
        kind: item.decision.kind === 'remove' ? 'remove' : 'repeat',
        row: item.row,
        position: item.position,
        inspectionId: inspection.id,
        inspectionDate: inspection.date,
        findingId: item.findingId,
        seriesId: item.seriesId,
        interval: item.decision.kind === 'repeat-inspection' ? item.decision.repeatInterval : null,
        action: item.decision.kind === 'remove' ? item.decision.action : null,
      });
    }
  }
  return open;
}

const round = (value: number) => Math.round(value * 10) / 10;

/** A due date of some kind: by day, by CSN, by TSN (each may be absent). */
interface DueMark {
  dueDate: string | null;
  dueCsn: number | null;
  dueTsn: number | null;
}

export type Removal = NonNullable<EngineDue['removal']>;

/**
 * What an engine's due status rests on, whatever the day: the open requirements, every dated
 * candidate (the governing one first), the removals, the rows with nothing to run from and the
 * 90-day rates. It changes only when a signature, a utilization record, the engine or its model
 * does, so it can be kept and the state read from it on any day (`dueStateOn`).
 */
export interface DueBasis {
  requirements: Requirement[];
  governing: Candidate | null;
  /**
   * The distinct due marks of every candidate (`[dueDate, dueCsn, dueTsn]`): each can make the
   * engine overdue or due soon. Kept short, as a fleet's bases are read at once.
   */
  marks: [string | null, number | null, number | null][];
  /** The remove requirements, the most pressing first. */
  removals: Removal[];
  unknownRows: string[];
  rates: { cyclesPerDay: number | null; hoursPerDay: number | null; windowEnd: string | null };
}

export type DueBasisInput = Omit<
  DueInput,
  'today' | 'soon' | 'staleAfterDays' | 'awaitingBeyondLimits' | 'engine'
> & {
  engine: Pick<DueInput['engine'], 'baseline'>;
};

/**
 * The day-independent part of the due status (DESIGN §5.6): the next inspection due (standard
 * interval per row from the latest inspection that viewed it fully, else the baseline; each open
 * repeat requirement from its own inspection) and the removals, with the 90-day rates.
 */
export function dueBasis(input: DueBasisInput): DueBasis {
  const { engine } = input;
  const rates = dailyUtilization(input.utilization);
  const utilization = { cyclesPerDay: rates.cyclesPerDay, hoursPerDay: rates.hoursPerDay };

  const inspections = [...input.inspections]
    .filter(
      (inspection) =>
        engine.baseline?.kind !== 'shop-release' || inspection.date > engine.baseline.date,
    )
    .sort(byOrder);
  const requirements = openRequirements(inspections);

  const candidates: Candidate[] = [];
  const unknownRows: string[] = [];
  if (input.standardInterval) {
    for (const row of input.rows) {
      const from =
        inspections.findLast((inspection) =>
          inspection.coverage.some((item) => item.row === row.key && item.status === 'full'),
        ) ?? null;
      const start = from ?? engine.baseline;
      if (!start) {
        unknownRows.push(row.key);
        continue;
      }
      candidates.push({
        kind: 'standard',
        row: row.key,
        position: null,
        inspectionId: from?.id ?? null,
        interval: input.standardInterval,
        ...dueOf(forecast({ from: start, interval: input.standardInterval, utilization })),
      });
    }
  }
  for (const requirement of requirements) {
    if (requirement.kind !== 'repeat' || !requirement.interval) continue;
    const from = inspections.find((inspection) => inspection.id === requirement.inspectionId)!;
    candidates.push({
      kind: 'repeat',
      row: requirement.row,
      position: requirement.position,
      inspectionId: requirement.inspectionId,
      interval: requirement.interval,
      ...dueOf(forecast({ from, interval: requirement.interval, utilization })),
    });
  }
  const dated = candidates
    .filter((candidate) => candidate.dueDate !== null)
    .sort(
      (a, b) =>
        a.dueDate!.localeCompare(b.dueDate!) ||
        Number(a.kind === 'standard') - Number(b.kind === 'standard'),
    );

  const removals = requirements.flatMap((requirement): Removal[] => {
    if (requirement.kind !== 'remove' || !requirement.action) return [];
    const from = inspections.find((inspection) => inspection.id === requirement.inspectionId)!;
    const action = requirement.action;
    const due =
      action.kind === 'remove-before-next-flight'
        ? { dueCsn: from.csn, dueTsn: from.tsn, dueDate: from.outcomeSignedAt.slice(0, 10) }
        : action.kind === 'remove-within'
          ? (({ dueCsn, dueTsn, dueDate }) => ({ dueCsn, dueTsn, dueDate }))(
              forecast({
                from,
                interval: { cycles: action.cycles, hours: action.hours, days: null },
                utilization,
              }),
            )
          : { dueCsn: null, dueTsn: null, dueDate: null };
    return [{ kind: action.kind, inspectionId: from.id, ...due }];
  });
  const actionOrder = {
    'remove-before-next-flight': 0,
    'remove-within': 1,
    'remove-at-next-shop-visit': 2,
  };
  removals.sort(
    (a, b) =>
      actionOrder[a.kind] - actionOrder[b.kind] ||
      (a.dueDate ?? '9999').localeCompare(b.dueDate ?? '9999'),
  );

  return {
    requirements,
    governing: dated[0] ?? null,
    marks: [
      ...new Map(
        candidates
          .filter((item) => item.dueDate !== null || item.dueCsn !== null || item.dueTsn !== null)
          .map((item) => [
            `${item.dueDate}|${item.dueCsn}|${item.dueTsn}`,
            [item.dueDate, item.dueCsn, item.dueTsn] as [
              string | null,
              number | null,
              number | null,
            ],
          ]),
      ).values(),
    ],
    removals,
    unknownRows,
    rates: {
      cyclesPerDay: rates.cyclesPerDay,
      hoursPerDay: rates.hoursPerDay,
      windowEnd: rates.windowEnd,
    },
  };
}

/** What the state of a basis is read with: the day, the engine's figures now and the margins. */
export type DueDayInput = Pick<
  DueInput,
  'today' | 'soon' | 'staleAfterDays' | 'awaitingBeyondLimits'
> & {
  engine: Omit<DueInput['engine'], 'baseline'>;
};

/**
 * The due status of an engine on a day (DESIGN §5.6): CSN and TSN now projected from the 90-day
 * rates, and the state (in shop or removed, awaiting disposition, overdue, unknown, due soon, ok)
 * with the reason in words.
 */
export function dueStateOn(
  basis: DueBasis,
  input: DueDayInput,
): Omit<EngineDue, 'trendWarnings' | 'booking' | 'lastMove'> {
  const { today, engine } = input;
  const { rates, governing } = basis;
  const since = Math.max(0, daysBetween(engine.tsnCsnAsOf, today));
  const csnNow = engine.csn + (rates.cyclesPerDay ?? 0) * since;
  const tsnNow = engine.tsn + (rates.hoursPerDay ?? 0) * since;

  const passed = (due: DueMark) =>
    (due.dueDate !== null && due.dueDate < today) ||
    (due.dueCsn !== null && csnNow >= due.dueCsn) ||
    (due.dueTsn !== null && tsnNow >= due.dueTsn);
  const near = (due: DueMark) =>
    (due.dueDate !== null && due.dueDate <= addDays(today, input.soon.days)) ||
    (due.dueCsn !== null && due.dueCsn - csnNow <= input.soon.cycles) ||
    (due.dueTsn !== null && due.dueTsn - tsnNow <= input.soon.hours);
  const dues: DueMark[] = [
    ...basis.marks.map(([dueDate, dueCsn, dueTsn]) => ({ dueDate, dueCsn, dueTsn })),
    ...basis.removals.filter((item) => item.dueDate !== null || item.dueCsn !== null),
  ];
  const staleDays = input.staleAfterDays ?? 30;
  const stale = rates.windowEnd === null || daysBetween(rates.windowEnd, today) > staleDays;

  let state: DueState;
  let reason: string;
  const overdue = dues.find(passed);
  if (engine.status === 'in-shop' || engine.status === 'removed') {
    state = engine.status;
    reason = engine.status === 'in-shop' ? 'The engine is in the shop.' : 'The engine is removed.';
  } else if (input.awaitingBeyondLimits) {
    state = 'awaiting-disposition';
    reason = 'A submitted inspection holds a finding beyond limits, not yet dispositioned.';
  } else if (overdue) {
    state = 'overdue';
    reason = `Due ${[
      overdue.dueDate ? dayWords(overdue.dueDate) : null,
      overdue.dueCsn !== null ? `at CSN ${countWords(overdue.dueCsn)}` : null,
      overdue.dueTsn !== null ? `at TSN ${countWords(overdue.dueTsn)} h` : null,
    ]
      .filter(Boolean)
      .join(' or ')}; CSN now about ${countWords(csnNow)}.`;
  } else if (basis.unknownRows.length || !governing || stale) {
    state = 'unknown';
    reason = basis.unknownRows.length
      ? `No inspection or earlier record of ${basis.unknownRows.join(', ')} to run the standard interval from.`
      : stale
        ? `Utilization not recorded for more than ${staleDays} days: CSN and TSN now cannot be told.`
        : 'No due date can be computed: no interval or no utilization.';
  } else if (dues.some(near)) {
    state = 'due-soon';
    reason = `Due within ${input.soon.days} days, ${input.soon.cycles} cycles or ${input.soon.hours} hours.`;
  } else {
    state = 'ok';
    reason = `Next due ${dayWords(governing.dueDate!)}.`;
  }

  return {
    state,
    reason,
    governedBy: governing && {
      kind: governing.kind,
      row: governing.row,
      position: governing.position,
      inspectionId: governing.inspectionId,
    },
    interval: governing?.interval ?? null,
    nextInspection: governing && {
      dueCsn: governing.dueCsn,
      dueTsn: governing.dueTsn,
      dueDate: governing.dueDate,
      governing: governing.governing,
    },
    removal: basis.removals[0] ?? null,
    requirements: basis.requirements,
    csnNow: rates.cyclesPerDay === null ? engine.csn : round(csnNow),
    tsnNow: rates.hoursPerDay === null ? engine.tsn : round(tsnNow),
  };
}

/** The due status of one engine on a day (DESIGN §5.6): its basis read on `input.today`. */
export function dueStatus(
  input: DueInput,
): Omit<EngineDue, 'trendWarnings' | 'booking' | 'lastMove'> {
  const { baseline, ...engine } = input.engine;
  return dueStateOn(dueBasis({ ...input, engine: { baseline } }), { ...input, engine });
}

function dueOf(result: ReturnType<typeof forecast>): Due {
  return {
    dueCsn: result.dueCsn,
    dueTsn: result.dueTsn,
    dueDate: result.dueDate,
    governing: result.governing,
  };
}

/** A due date as people read it: the day, with the CSN and TSN it falls due at. */
export function dueWords(due: Pick<Due, 'dueDate' | 'dueCsn' | 'dueTsn'> | null): string {
  if (!due) return 'no due date';
  const marks = [
    due.dueCsn !== null ? `CSN ${countWords(due.dueCsn)}` : null,
    due.dueTsn !== null ? `TSN ${countWords(due.dueTsn)} h` : null,
  ].filter(Boolean);
  const day = due.dueDate ? dayWords(due.dueDate) : 'no date';
  return marks.length ? `${day} (${marks.join(', ')})` : day;
}
