import {
  dueStateLabels,
  type EngineDue,
  type ParsedBookingInput,
  type PlanningItem,
  type PlanningQuery,
  type PlanningResponse,
  type Requirement,
} from '@emberline/contracts/planning';
import type { Rule } from '@emberline/contracts/limits';
import type { EngineListResponse } from '@emberline/contracts/fleet';
import { can } from '@emberline/contracts/permissions';
import { decisionSchema } from '@emberline/contracts/review';
import { dayWords, daysBetween } from '@emberline/domain/dates';
import { trendWarning } from '@emberline/domain/trend';
import { MM2_PER_SQUARE_INCH, MM_PER_INCH } from '@emberline/domain/units';
import { dailyUtilization, type UtilizationIncrement } from '@emberline/domain/utilization';
import { actionWords } from '@emberline/domain/decision-words';
import { dueStatus, type DueInspection } from '@emberline/domain/due-status';
import type { outcomeContent, releaseContent } from '@emberline/domain/signature-content';
import type { AppContext, RequestMeta } from '../../context';
import { inTransaction, type DbOrTx } from '../../db/client';
import { AppError } from '../../http/app-error';
import type { Principal } from '../../http/principal';
import { recordScope } from '../../http/record-access';
import { writeCsv } from '../../lib/csv';
import { appendAudit } from '../audit/audit.repository';
import { findEngineModel, listModelRows } from '../engine-models/engine-models.repository';
import { listRules } from '../limit-sets/limit-sets.repository';
import { findEngineRowsIn, type EngineListRow } from '../engines/engines.repository';
import { createEnginesService } from '../engines/engines.service';
import {
  bookingsOf,
  coverageOfInspections,
  findingPlaces,
  outcomeSignaturesOf,
  releaseSignaturesOf,
  seriesPoints,
  signedInspections,
  upsertBooking,
  utilizationOf,
  type EngineScope,
} from './planning.repository';

type OutcomeContent = ReturnType<typeof outcomeContent>;
type ReleaseContent = ReturnType<typeof releaseContent>;

/** "Today" in the installation's time zone, as `YYYY-MM-DD`. */
export function todayIn(timeZone: string, now: Date): string {
  return new Intl.DateTimeFormat('en-CA', {
    timeZone,
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
  }).format(now);
}

const groupBy = <T, K>(items: readonly T[], key: (item: T) => K) => {
  const groups = new Map<K, T[]>();
  for (const item of items) {
    const group = groups.get(key(item));
    if (group) group.push(item);
    else groups.set(key(item), [item]);
  }
  return groups;
};

/**
 * The inspections of some engines with the decisions their counting outcome signed: the current
 * outcome, or, while a correction after release waits, the outcome of the latest release. One
 * query a kind of row, whatever the number of engines.
 */
function dueInspections(db: DbOrTx, scope: EngineScope): Map<string, DueInspection[]> {
  const rows = signedInspections(db, scope);
  const releases = new Map(
    releaseSignaturesOf(db, scope).map((signature) => [signature.subjectId, signature]),
  );
  const outcomes = outcomeSignaturesOf(db, scope);
  const outcomesById = new Map(outcomes.map((signature) => [signature.id, signature]));
  const outcomesBySha = new Map(outcomes.map((signature) => [signature.sha256, signature]));
  const counting = rows.flatMap((row) => {
    const release = releases.get(row.id);
    const outcome = row.outcomeSignatureId
      ? outcomesById.get(row.outcomeSignatureId)
      : outcomesBySha.get(
          (release?.content as ReleaseContent | undefined)?.outcomeSignatureSha256 ?? '',
        );
    return outcome ? [{ row, outcome, content: outcome.content as OutcomeContent }] : [];
  });
  const places = new Map(findingPlaces(db, scope).map((place) => [place.id, place]));
  const coverage = groupBy(coverageOfInspections(db, scope), (item) => item.inspectionId);
  const inspections = counting.map(({ row, outcome, content }) => ({
    engineId: row.engineId,
    inspection: {
      id: row.id,
      date: row.date,
      csn: row.csn,
      tsn: row.tsn,
      outcomeSignedAt: outcome.signedAt,
      coverage: (coverage.get(row.id) ?? []).map((item) => ({
        row: item.row,
        status: item.status,
        viewedPositions: item.viewedPositions,
      })),
      decisions: content.dispositions.flatMap((entry) => {
        const place = places.get(entry.findingId);
        return place
          ? [
              {
                findingId: entry.findingId,
                seriesId: place.seriesId,
                row: place.row,
                position: place.position,
                decision: decisionSchema.parse(entry.decision),
              },
            ]
          : [];
      }),
    } satisfies DueInspection,
  }));
  return new Map(
    [...groupBy(inspections, (item) => item.engineId)].map(([engineId, items]) => [
      engineId,
      items.map((item) => item.inspection),
    ]),
  );
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
      const outer = rule.repeatMax ?? rule.serviceableMax;
      if (outer === null) return [];
      const area = rule.measure === 'area';
      const limit =
        rule.unit === 'in'
          ? outer * MM_PER_INCH
          : rule.unit === 'in2'
            ? outer * MM2_PER_SQUARE_INCH
            : outer;
      const measured = series.flatMap((point) => {
        const value = area ? point.areaMm2 : point.lengthMm;
        const uncertainty = (area ? point.uncertaintyMm2 : point.uncertaintyMm) ?? 0;
        return value === null ? [] : [{ csn: point.csn, value, uncertainty }];
      });
      const warning = trendWarning(measured, limit, expectedCsn);
      return warning
        ? [{ seriesId, findingId: latest.id, cyclesRemaining: Math.round(warning.cyclesRemaining) }]
        : [];
    });
  };
}

export function createPlanningService(ctx: AppContext) {
  const { db, config } = ctx;
  const engines = createEnginesService(ctx);
  const today = () => todayIn(config.timeZone, ctx.now());

  /** The due status of engines (DESIGN §5.6), computed when read, with their bookings. */
  function dueOf(rows: readonly EngineListRow[], scope: EngineScope): Map<string, EngineDue> {
    const inspections = dueInspections(db, scope);
    const utilization = groupBy(utilizationOf(db, scope), (record) => record.engineId);
    const bookings = new Map(bookingsOf(db, scope).map((booking) => [booking.engineId, booking]));
    const models = new Map(
      [...new Set(rows.map((row) => row.modelId))].map((modelId) => [
        modelId,
        { model: findEngineModel(db, modelId)!, rows: listModelRows(db, modelId) },
      ]),
    );
    const day = today();
    const ratesOf = new Map(
      [...utilization].map(([engineId, records]) => [
        engineId,
        dailyUtilization(records as UtilizationIncrement[]).cyclesPerDay ?? 0,
      ]),
    );
    const statuses = rows.map((engine) => {
      const { model, rows: modelRows } = models.get(engine.modelId)!;
      const baseline = engine.shopRelease
        ? { kind: 'shop-release' as const, ...engine.shopRelease }
        : engine.preFleetInspection
          ? { kind: 'pre-fleet' as const, ...engine.preFleetInspection }
          : null;
      return {
        engine,
        status: dueStatus({
          today: day,
          rows: modelRows,
          standardInterval: model.standardInterval ?? null,
          engine: {
            status: engine.status,
            csn: engine.csn,
            tsn: engine.tsn,
            tsnCsnAsOf: engine.tsnCsnAsOf,
            baseline,
          },
          utilization: (utilization.get(engine.id) ?? []) as UtilizationIncrement[],
          inspections: inspections.get(engine.id) ?? [],
          awaitingBeyondLimits: Boolean(engine.awaitingBeyondLimits),
          soon: config.dueSoon,
        }),
      };
    });
    // One read of every open series' measurements, for the trend warnings of all engines.
    const warningsOf = seriesWarnings(db, [
      ...new Set(
        statuses.flatMap(({ status }) => status.requirements.map((item) => item.seriesId)),
      ),
    ]);
    return new Map(
      statuses.map(({ engine, status }) => {
        const booking = bookings.get(engine.id);
        const dueDate = status.nextInspection?.dueDate ?? null;
        const rates = ratesOf.get(engine.id);
        const expectedCsn =
          status.nextInspection?.dueCsn ??
          (dueDate && status.csnNow !== null && rates
            ? status.csnNow + rates * Math.max(0, daysBetween(day, dueDate))
            : null);
        return [
          engine.id,
          {
            ...status,
            trendWarnings: expectedCsn === null ? [] : warningsOf(status.requirements, expectedCsn),
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
          },
        ];
      }),
    );
  }

  return {
    /**
     * The due status of a page of engines as a list shows it (for those who may read planning);
     * the list's rows go in as they are.
     */
    withNextDue(principal: Principal, page: EngineListResponse): EngineListResponse {
      if (!can(principal.user.role, 'read:planning') || page.items.length === 0) return page;
      const ids = page.items.map((item) => item.id);
      const due = dueOf(findEngineRowsIn(db, { engineIds: ids }), { engineIds: ids });
      return {
        ...page,
        items: page.items.map((item) => {
          const status = due.get(item.id);
          return {
            ...item,
            nextDue: status
              ? {
                  state: status.state,
                  dueDate: status.nextInspection?.dueDate ?? null,
                  dueCsn: status.nextInspection?.dueCsn ?? null,
                  governing: status.nextInspection?.governing ?? null,
                }
              : null,
          };
        }),
      };
    },

    engineDue(principal: Principal, engineId: string): EngineDue {
      const engine = engines.visibleEngine(principal, engineId);
      return dueOf([engine], { engineId: engine.id }).get(engine.id)!;
    },

    /**
     * The planning board: every engine the caller may see with its due status, overdue first and
     * then by the date it falls due; filtered by customer, model, state and the days due.
     */
    list(principal: Principal, query: PlanningQuery): PlanningResponse {
      const scope: EngineScope = {
        organisationId: recordScope(principal).organisationId ?? query.organisationId,
        modelId: query.modelId,
      };
      const rows = findEngineRowsIn(db, scope);
      const due = dueOf(rows, scope);
      const rank = {
        overdue: 0,
        'awaiting-disposition': 1,
        'due-soon': 2,
        unknown: 3,
        ok: 4,
        'in-shop': 5,
        removed: 6,
      };
      const dateOf = (item: EngineDue) =>
        [item.nextInspection?.dueDate, item.removal?.dueDate]
          .filter((date): date is string => Boolean(date))
          .sort()[0] ?? null;
      const items = rows
        .map((engine): PlanningItem => ({
          ...due.get(engine.id)!,
          engineId: engine.id,
          serialNumber: engine.serialNumber,
          modelId: engine.modelId,
          modelName: engine.modelName,
          organisationId: engine.organisationId,
          organisationName: engine.organisationName,
          registration: engine.registration,
        }))
        .filter((item) => !query.state || item.state === query.state)
        .filter((item) => {
          if (!query.from && !query.to) return true;
          const date = dateOf(item);
          return (
            date !== null && (!query.from || date >= query.from) && (!query.to || date <= query.to)
          );
        })
        .sort(
          (a, b) =>
            rank[a.state] - rank[b.state] ||
            (dateOf(a) ?? '9999').localeCompare(dateOf(b) ?? '9999') ||
            a.serialNumber.localeCompare(b.serialNumber),
        );
      const start = (query.page - 1) * query.pageSize;
      return {
        items: items.slice(start, start + query.pageSize),
        total: items.length,
        page: query.page,
        pageSize: query.pageSize,
      };
    },

    /** The whole board (every page) as a CSV file a planner can open in a spreadsheet. */
    exportCsv(principal: Principal, query: PlanningQuery): string {
      const { items } = this.list(principal, { ...query, page: 1, pageSize: 100_000 });
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
          item.removal
            ? actionWords({ kind: item.removal.kind, cycles: null, hours: null }).trim()
            : null,
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
      const current = dueOf([engine], { engineId: engine.id }).get(engine.id)!;
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
