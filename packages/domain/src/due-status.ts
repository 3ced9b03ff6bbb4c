import type { Interval } from '@emberline/contracts/limits';
import type {
  Baseline,
  Due,
  DueState,
  EngineDue,
  Requirement,
} from '@emberline/contracts/planning';
import type { Decision } from '@emberline/contracts/review';
import { addDays, dayWords, daysBetween } from './dates';
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

type Candidate = Due & {
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

/**
 * The due status of one engine (DESIGN §5.6), computed when read: the open requirements, the next
 * inspection due (standard interval per row from the latest inspection that viewed it fully, else
 * the baseline; each open repeat requirement from its own inspection), the removal due, CSN and TSN
 * now projected from the 90-day rates, and the state.
 */
export function dueStatus(input: DueInput): Omit<EngineDue, 'trendWarnings' | 'booking'> {
  const { today, engine } = input;
  const rates = dailyUtilization(input.utilization);
  const utilization = { cyclesPerDay: rates.cyclesPerDay, hoursPerDay: rates.hoursPerDay };
  const since = Math.max(0, daysBetween(engine.tsnCsnAsOf, today));
  const csnNow = engine.csn + (rates.cyclesPerDay ?? 0) * since;
  const tsnNow = engine.tsn + (rates.hoursPerDay ?? 0) * since;

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
  const governing = dated[0] ?? null;

  const removals = requirements.flatMap((requirement) => {
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
  const removal = removals[0] ?? null;

  const passed = (due: { dueDate: string | null; dueCsn: number | null; dueTsn: number | null }) =>
    (due.dueDate !== null && due.dueDate < today) ||
    (due.dueCsn !== null && csnNow >= due.dueCsn) ||
    (due.dueTsn !== null && tsnNow >= due.dueTsn);
  const near = (due: { dueDate: string | null; dueCsn: number | null; dueTsn: number | null }) =>
    (due.dueDate !== null && due.dueDate <= addDays(today, input.soon.days)) ||
    (due.dueCsn !== null && due.dueCsn - csnNow <= input.soon.cycles) ||
    (due.dueTsn !== null && due.dueTsn - tsnNow <= input.soon.hours);
  const dues = [
    ...candidates,
    ...removals.filter((item) => item.dueDate !== null || item.dueCsn !== null),
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
    const count = (value: number) => Math.round(value).toLocaleString('en-GB');
    reason = `Due ${[
      overdue.dueDate ? dayWords(overdue.dueDate) : null,
      overdue.dueCsn !== null ? `at CSN ${count(overdue.dueCsn)}` : null,
      overdue.dueTsn !== null ? `at TSN ${count(overdue.dueTsn)} h` : null,
    ]
      .filter(Boolean)
      .join(' or ')}; CSN now about ${count(csnNow)}.`;
  } else if (unknownRows.length || !governing || stale) {
    state = 'unknown';
    reason = unknownRows.length
      ? `No inspection or earlier record of ${unknownRows.join(', ')} to run the standard interval from.`
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
    removal,
    requirements,
    csnNow: rates.cyclesPerDay === null ? engine.csn : round(csnNow),
    tsnNow: rates.hoursPerDay === null ? engine.tsn : round(tsnNow),
  };
}

function dueOf(result: ReturnType<typeof forecast>): Due {
  return {
    dueCsn: result.dueCsn,
    dueTsn: result.dueTsn,
    dueDate: result.dueDate,
    governing: result.governing,
  };
}
