import {
  dueStateLabels,
  type DueState,
  type DueMove,
  type EngineDue,
  type ParsedBookingInput,
  type PlanningItem,
  type PlanningQuery,
  type PlanningResponse,
  type Requirement,
} from '@emberline/contracts/planning';
import type { Rule } from '@emberline/contracts/limits';
import type { EngineListQuery, EngineListResponse } from '@emberline/contracts/fleet';
import { dayWords, daysBetween } from '@emberline/domain/dates';
import { seriesAgainstRule, trendWarning } from '@emberline/domain/trend';
import { removalKindWords } from '@emberline/domain/decision-words';
import { dueStateOn, type DueBasis } from '@emberline/domain/due-status';
import type { AppContext, RequestMeta } from '../../context';
import { inTransaction, type DbOrTx } from '../../db/client';
import { AppError } from '../../http/app-error';
import type { Principal } from '../../http/principal';
import { recordScope } from '../../http/record-access';
import { writeCsv } from '../../lib/csv';
import { appendAudit } from '../audit/audit.repository';
import { listRules } from '../limit-sets/limit-sets.repository';
import { findEngineRowsIn, type EngineDueRow } from '../engines/engines.repository';
import { createEnginesService } from '../engines/engines.service';
import { computeDueBases, groupBy, readDueBases, type DueView } from './due-basis';
import { bookingsOf, seriesPoints, upsertBooking, type EngineScope } from './planning.repository';

/** "Today" in the installation's time zone, as `YYYY-MM-DD`. */
export function todayIn(timeZone: string, now: Date): string {
  return new Intl.DateTimeFormat('en-CA', {
    timeZone,
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
  }).format(now);
}

/**
 * Trend warnings (DESIGN §5.6): for each damage series with a finding among the open requirements,
 * the projection of value plus uncertainty against the outer limit of the rule that judged its
 * latest finding, when it comes before the CSN expected at the next due date.
 */
function seriesWarnings(db: DbOrTx, seriesIds: readonly string[]) {
  const points = groupBy(seriesPoints(db, seriesIds), (point) => point.seriesId);
  const rules = new Map<string, Map<string, Rule>>();
  const rulesOf = (limitSetId: string) => {
    let found = rules.get(limitSetId);
    if (!found) {
      found = new Map(listRules(db, limitSetId).map((rule) => [rule.id, rule]));
      rules.set(limitSetId, found);
    }
    return found;
  };
  return (
    requirements: readonly Requirement[],
    expectedCsn: number,
  ): EngineDue['trendWarnings'] => {
    const open = [...new Set(requirements.map((requirement) => requirement.seriesId))];
    return open.flatMap((seriesId) => {
      const series = points.get(seriesId) ?? [];
      const latest = series.at(-1);
      const evaluation = latest?.evaluation as { ruleId?: string | null } | null | undefined;
      const rule =
        latest?.limitSetId && evaluation?.ruleId
          ? rulesOf(latest.limitSetId).get(evaluation.ruleId)
          : undefined;
      if (!latest || !rule) return [];
      const against = seriesAgainstRule(rule, series);
      if (!against) return [];
      const warning = trendWarning(against.points, against.limit, expectedCsn);
      return warning
        ? [{ seriesId, findingId: latest.id, cyclesRemaining: Math.round(warning.cyclesRemaining) }]
        : [];
    });
  };
}

const compareText = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);

/** The order of the planning board: what needs a planner first. */
const dueStateRank: Record<DueState, number> = {
  overdue: 0,
  'awaiting-disposition': 1,
  'due-soon': 2,
  unknown: 3,
  ok: 4,
  'in-shop': 5,
  removed: 6,
};

/** What needs a planner first: by due state, then by the day it falls due. */
const byDue = (a: Reading, b: Reading) =>
  dueStateRank[a.status.state] - dueStateRank[b.status.state] ||
  compareText(a.date ?? '9999', b.date ?? '9999');

/** The fleet list's "Next due" of an engine's due state. */
const nextDueOf = (status: Reading['status']) => ({
  state: status.state,
  dueDate: status.nextInspection?.dueDate ?? null,
  dueCsn: status.nextInspection?.dueCsn ?? null,
  governing: status.nextInspection?.governing ?? null,
});

/** An engine's due state on today's date, with the basis it was read from. */
interface Reading {
  engine: EngineDueRow;
  basis: DueBasis;
  lastMove: DueMove | null;
  status: ReturnType<typeof dueStateOn>;
  /** The earliest of the next inspection's and the removal's due dates. */
  date: string | null;
}

export function createPlanningService(ctx: AppContext) {
  const { db, config } = ctx;
  const engines = createEnginesService(ctx);
  const today = () => todayIn(config.timeZone, ctx.now());

  /**
   * The due state of engines (DESIGN §5.6) on today's date: from their kept bases, or, as an owner
   * is told it, from their released inspections only (computed now, with nothing of the review).
   */
  function readingsOf(
    rows: readonly EngineDueRow[],
    scope: EngineScope,
    day = today(),
    view: DueView = { releasedOnly: false },
  ): Reading[] {
    const bases = view.releasedOnly
      ? new Map(
          [...computeDueBases(db, scope, rows, view)].map(([engineId, basis]) => [
            engineId,
            { basis, lastMove: null },
          ]),
        )
      : readDueBases(ctx, db, rows, scope);
    return rows.map((engine) => {
      const { basis, lastMove } = bases.get(engine.id)!;
      const status = dueStateOn(basis, {
        today: day,
        engine: {
          status: engine.status,
          csn: engine.csn,
          tsn: engine.tsn,
          tsnCsnAsOf: engine.tsnCsnAsOf,
        },
        awaitingBeyondLimits: !view.releasedOnly && Boolean(engine.awaitingBeyondLimits),
        soon: config.dueSoon,
      });
      const dates = [status.nextInspection?.dueDate, status.removal?.dueDate].filter(
        (date): date is string => Boolean(date),
      );
      return { engine, basis, lastMove, status, date: dates.sort()[0] ?? null };
    });
  }

  /**
   * The whole due status of the engines shown: their bookings, their last move and (unless a
   * file is written) the trend warnings of their open series, each kind in one read.
   */
  function completed(
    readings: readonly Reading[],
    scope: EngineScope,
    options = { warnings: true, bookings: true },
  ): EngineDue[] {
    const bookings = new Map(
      options.bookings ? bookingsOf(db, scope).map((booking) => [booking.engineId, booking]) : [],
    );
    const warningsOf = options.warnings
      ? seriesWarnings(db, [
          ...new Set(
            readings.flatMap(({ status }) =>
              status.requirements.map((requirement) => requirement.seriesId),
            ),
          ),
        ])
      : null;
    const day = today();
    return readings.map(({ engine, basis, lastMove, status }) => {
      const booking = bookings.get(engine.id);
      const dueDate = status.nextInspection?.dueDate ?? null;
      const rate = basis.rates.cyclesPerDay;
      const expectedCsn =
        status.nextInspection?.dueCsn ??
        (dueDate && status.csnNow !== null && rate
          ? status.csnNow + rate * Math.max(0, daysBetween(day, dueDate))
          : null);
      return {
        ...status,
        trendWarnings:
          warningsOf && expectedCsn !== null ? warningsOf(status.requirements, expectedCsn) : [],
        lastMove,
        booking: booking
          ? {
              plannedDate: booking.plannedDate,
              note: booking.note,
              bookedByName: booking.bookedByName,
              bookedAt: booking.bookedAt.toISOString(),
              dueDateAtBooking: booking.dueDateAtBooking,
              afterDueDate: dueDate !== null && booking.plannedDate > dueDate && dueDate >= day,
            }
          : null,
      };
    });
  }

  /** Staff read every signed inspection; an owner, the released ones as released. */
  const viewOf = (principal: Principal): DueView => ({
    releasedOnly: recordScope(principal).releasedOnly,
  });

  const scopeOf = (
    principal: Principal,
    query: Pick<PlanningQuery, 'organisationId' | 'modelId'>,
  ): EngineScope => ({
    organisationId: recordScope(principal).organisationId ?? query.organisationId,
    modelId: query.modelId,
  });

  /** The engines of the board, filtered and in its order, with their due state. */
  function board(scope: EngineScope, query: PlanningQuery): Reading[] {
    return readingsOf(findEngineRowsIn(db, scope), scope)
      .filter(({ status }) => !query.state || status.state === query.state)
      .filter(({ status }) => {
        // Within the days asked: the next inspection or the removal falls due in them.
        if (!query.from && !query.to) return true;
        const within = (date: string | null | undefined) =>
          date != null && (!query.from || date >= query.from) && (!query.to || date <= query.to);
        return within(status.nextInspection?.dueDate) || within(status.removal?.dueDate);
      })
      .sort((a, b) => byDue(a, b) || compareText(a.engine.serialNumber, b.engine.serialNumber));
  }

  const itemOf = (engine: EngineDueRow, due: EngineDue): PlanningItem => ({
    ...due,
    engineId: engine.id,
    serialNumber: engine.serialNumber,
    modelId: engine.modelId,
    modelName: engine.modelName,
    organisationId: engine.organisationId,
    organisationName: engine.organisationName,
    registration: engine.registration,
  });

  return {
    /**
     * Every engine's due status as it stands on a day (today, or an earlier day to tell what
     * changed since), without trend warnings: what the reminders read.
     */
    fleetOn(day: string): PlanningItem[] {
      const readings = readingsOf(findEngineRowsIn(db, {}), {}, day)
        .filter(({ status }) => status.state !== 'removed')
        .sort((a, b) => compareText(a.date ?? '9999', b.date ?? '9999'));
      const dues = completed(readings, {}, { warnings: false, bookings: true });
      return readings.map((reading, index) => itemOf(reading.engine, dues[index]!));
    },

    /**
     * The due status of a page of engines as a list shows it (for those who may read planning);
     * the list's rows go in as they are.
     */
    withNextDue(principal: Principal, page: EngineListResponse): EngineListResponse {
      if (page.items.length === 0) return page;
      const ids = page.items.map((item) => item.id);
      const due = new Map(
        readingsOf(
          findEngineRowsIn(db, { engineIds: ids }),
          { engineIds: ids },
          today(),
          viewOf(principal),
        ).map((reading) => [reading.engine.id, reading.status]),
      );
      return {
        ...page,
        items: page.items.map((item) => {
          const status = due.get(item.id);
          return { ...item, nextDue: status ? nextDueOf(status) : null };
        }),
      };
    },

    /**
     * The fleet list sorted by due state and date, or filtered by due state: every engine of the
     * list's filters read, then ordered and paged (those who may read planning only).
     */
    fleetByDue(principal: Principal, query: EngineListQuery): EngineListResponse {
      const { dueState, page, pageSize } = query;
      const all = engines.list(principal, {
        ...query,
        dueState: undefined,
        sort: query.sort === 'nextDue' ? 'serialNumber' : query.sort,
        order: query.sort === 'nextDue' ? 'asc' : query.order,
        page: 1,
        pageSize: 1_000_000,
      });
      const scope = scopeOf(principal, query);
      const readings = new Map(
        readingsOf(findEngineRowsIn(db, scope), scope, today(), viewOf(principal)).map(
          (reading) => [reading.engine.id, reading],
        ),
      );
      const direction = query.sort === 'nextDue' && query.order === 'desc' ? -1 : 1;
      // The list's own order stays for its other sorts (a stable sort keeps it).
      const items = all.items
        .map((item) => ({ item, reading: readings.get(item.id)! }))
        .filter(({ reading }) => !dueState || reading.status.state === dueState)
        .sort((a, b) =>
          query.sort === 'nextDue'
            ? direction * byDue(a.reading, b.reading) ||
              compareText(a.item.serialNumber, b.item.serialNumber)
            : 0,
        );
      return {
        items: items
          .slice((page - 1) * pageSize, page * pageSize)
          .map(({ item, reading }) => ({ ...item, nextDue: nextDueOf(reading.status) })),
        total: items.length,
        page,
        pageSize,
      };
    },

    /**
     * An engine's due status. Its owner is told it as of the latest released inspection: no
     * booking, no trend warning and no move, nothing of an inspection still in review.
     */
    engineDue(principal: Principal, engineId: string): EngineDue {
      const engine = engines.visibleEngine(principal, engineId);
      const scope = { engineId: engine.id };
      const view = viewOf(principal);
      return completed(readingsOf([engine], scope, today(), view), scope, {
        warnings: !view.releasedOnly,
        bookings: !view.releasedOnly,
      })[0]!;
    },

    /**
     * The planning board: every engine the caller may see with its due status, overdue first and
     * then by the date it falls due; filtered by customer, model, state and the days due. The
     * trend warnings are read for the page shown.
     */
    list(principal: Principal, query: PlanningQuery): PlanningResponse {
      const scope = scopeOf(principal, query);
      const readings = board(scope, query);
      const start = (query.page - 1) * query.pageSize;
      const page = readings.slice(start, start + query.pageSize);
      const dues = completed(page, scope);
      return {
        items: page.map((reading, index) => itemOf(reading.engine, dues[index]!)),
        total: readings.length,
        page: query.page,
        pageSize: query.pageSize,
      };
    },

    /** The whole board (every page) as a CSV file a planner can open in a spreadsheet. */
    exportCsv(principal: Principal, query: PlanningQuery): string {
      const scope = scopeOf(principal, query);
      const readings = board(scope, query);
      const dues = completed(readings, scope, { warnings: false, bookings: true });
      const items = readings.map((reading, index) => itemOf(reading.engine, dues[index]!));
      return writeCsv(
        [
          'engine',
          'customer',
          'model',
          'state',
          'next due date',
          'due CSN',
          'due TSN',
          'governed by',
          'removal',
          'removal due',
          'planned date',
          'booking note',
        ],
        items.map((item) => [
          item.serialNumber,
          item.organisationName,
          item.modelName,
          dueStateLabels[item.state],
          item.nextInspection?.dueDate ?? null,
          item.nextInspection?.dueCsn ?? null,
          item.nextInspection?.dueTsn ?? null,
          item.governedBy
            ? `${item.governedBy.kind === 'repeat' ? 'repeat inspection' : 'standard interval'}${item.nextInspection?.governing ? `, ${item.nextInspection.governing}` : ''}`
            : null,
          item.removal ? removalKindWords[item.removal.kind] : null,
          item.removal?.dueDate ?? null,
          item.booking?.plannedDate ?? null,
          item.booking?.note ?? null,
        ]),
      );
    },

    /**
     * Books an engine's next inspection: not in the past, and not after its due date (an overdue
     * engine is booked from today on, and shows overdue until it is inspected).
     */
    book(
      principal: Principal,
      engineId: string,
      input: ParsedBookingInput,
      meta: RequestMeta,
    ): EngineDue {
      const engine = engines.visibleEngine(principal, engineId);
      const scope = { engineId: engine.id };
      const current = completed(readingsOf([engine], scope), scope, {
        warnings: false,
        bookings: true,
      })[0]!;
      const day = today();
      const dueDate = current.nextInspection?.dueDate ?? null;
      const refuse = (message: string) =>
        AppError.unprocessable(message, { fields: { plannedDate: [message] }, form: [] });
      if (input.plannedDate < day)
        throw refuse(`A booking cannot be in the past: choose ${dayWords(day)} or later.`);
      if (dueDate && dueDate >= day && input.plannedDate > dueDate)
        throw refuse(`The engine is due on ${dayWords(dueDate)}: book it on or before that day.`);
      // Overdue (a due date already passed): any day from today on, and it stays marked overdue.
      const now = ctx.now();
      inTransaction(db, (tx) => {
        upsertBooking(tx, {
          engineId,
          plannedDate: input.plannedDate,
          note: input.note,
          dueDateAtBooking: dueDate,
          bookedBy: principal.user.id,
          bookedAt: now,
        });
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'engine.booked',
          entityType: 'engine',
          entityId: engineId,
          before: current.booking
            ? { plannedDate: current.booking.plannedDate, note: current.booking.note }
            : null,
          after: { plannedDate: input.plannedDate, note: input.note, dueDate },
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
      return this.engineDue(principal, engineId);
    },
  };
}
