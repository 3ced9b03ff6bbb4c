import type { Due, DueMove } from '@emberline/contracts/planning';
import { permissionGrants } from '@emberline/contracts/permissions';
import { decisionSchema } from '@emberline/contracts/review';
import { dueBasis, type DueBasis, type DueInspection } from '@emberline/domain/due-status';
import type { outcomeContent, releaseContent } from '@emberline/domain/signature-content';
import type { UtilizationIncrement } from '@emberline/domain/utilization';
import type { AppContext } from '../../context';
import type { DbOrTx } from '../../db/client';
import { queueMail } from '../../lib/email/outbox';
import { publicOrigin } from '../auth/auth.service';
import { findEngineModel, listModelRows } from '../engine-models/engine-models.repository';
import { findEngineRowsIn, type EngineDueRow } from '../engines/engines.repository';
import { listActiveHomeUsers } from '../users/users.repository';
import {
  bookingsOf,
  coverageOfInspections,
  dueBasesOf,
  findingPlaces,
  outcomeSignaturesOf,
  releaseSignaturesOf,
  saveDueBasis,
  signedInspections,
  utilizationOf,
  type EngineScope,
} from './planning.repository';
import { bookingOverrunEmail } from './planning-emails';

type OutcomeContent = ReturnType<typeof outcomeContent>;
type ReleaseContent = ReturnType<typeof releaseContent>;

export const groupBy = <T, K>(items: readonly T[], key: (item: T) => K) => {
  const groups = new Map<K, T[]>();
  for (const item of items) {
    const group = groups.get(key(item));
    if (group) group.push(item);
    else groups.set(key(item), [item]);
  }
  return groups;
};

/** Which inspections count: every signed one (staff), or the released ones as released (owners). */
export interface DueView {
  releasedOnly: boolean;
}

/**
 * The inspections of some engines with the decisions their counting outcome signed: the current
 * outcome, or, while a correction after release waits, the outcome of the latest release. As an
 * owner sees them, only released inspections count, each with the outcome of its latest release.
 * One query a kind of row, whatever the number of engines.
 */
function dueInspections(
  db: DbOrTx,
  scope: EngineScope,
  view: DueView,
): Map<string, DueInspection[]> {
  const rows = signedInspections(db, scope);
  const releases = new Map(
    releaseSignaturesOf(db, scope).map((signature) => [signature.subjectId, signature]),
  );
  const outcomes = outcomeSignaturesOf(db, scope);
  const outcomesById = new Map(outcomes.map((signature) => [signature.id, signature]));
  const outcomesBySha = new Map(outcomes.map((signature) => [signature.sha256, signature]));
  const counting = rows.flatMap((row) => {
    const release = releases.get(row.id);
    const released = outcomesBySha.get(
      (release?.content as ReleaseContent | undefined)?.outcomeSignatureSha256 ?? '',
    );
    const outcome =
      !view.releasedOnly && row.outcomeSignatureId
        ? outcomesById.get(row.outcomeSignatureId)
        : released;
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

const engineRowsOf = (db: DbOrTx, scope: EngineScope) =>
  findEngineRowsIn(db, {
    engineIds: scope.engineId ? [scope.engineId] : scope.engineIds,
    organisationId: scope.organisationId,
    modelId: scope.modelId,
  });

/**
 * The due bases of the engines in scope, computed from their records now (DESIGN §5.6): from every
 * signed inspection (what is kept), or from the released ones only (what an owner is told).
 */
export function computeDueBases(
  db: DbOrTx,
  scope: EngineScope,
  rows: readonly EngineDueRow[] = engineRowsOf(db, scope),
  view: DueView = { releasedOnly: false },
): Map<string, DueBasis> {
  const inspections = dueInspections(db, scope, view);
  const utilization = groupBy(utilizationOf(db, scope), (record) => record.engineId);
  const models = new Map(
    [...new Set(rows.map((row) => row.modelId))].map((modelId) => [
      modelId,
      { model: findEngineModel(db, modelId)!, rows: listModelRows(db, modelId) },
    ]),
  );
  return new Map(
    rows.map((engine) => {
      const { model, rows: modelRows } = models.get(engine.modelId)!;
      const baseline = engine.shopRelease
        ? { kind: 'shop-release' as const, ...engine.shopRelease }
        : engine.preFleetInspection
          ? { kind: 'pre-fleet' as const, ...engine.preFleetInspection }
          : null;
      return [
        engine.id,
        dueBasis({
          rows: modelRows,
          standardInterval: model.standardInterval ?? null,
          engine: { baseline },
          utilization: (utilization.get(engine.id) ?? []) as UtilizationIncrement[],
          inspections: inspections.get(engine.id) ?? [],
        }),
      ];
    }),
  );
}

const dueOf = (basis: DueBasis | undefined): Due | null =>
  basis?.governing
    ? {
        dueDate: basis.governing.dueDate,
        dueCsn: basis.governing.dueCsn,
        dueTsn: basis.governing.dueTsn,
        governing: basis.governing.governing,
      }
    : null;

const sameDue = (a: Due | null, b: Due | null) =>
  a?.dueDate === b?.dueDate && a?.dueCsn === b?.dueCsn && a?.dueTsn === b?.dueTsn;

/**
 * Recomputes the due bases of the engines in scope inside the transaction of the change that can
 * move them, and keeps each move of the next inspection due with its reason. When a due date
 * comes earlier than an engine's booking, the planners are e-mailed (through the outbox, in the
 * same transaction). With no reason (a demo load) nothing is recorded as a move. Returns the moves.
 */
export function refreshDue(
  ctx: Pick<AppContext, 'config' | 'now'>,
  tx: DbOrTx,
  scope: EngineScope,
  reason: string | null,
): { engineId: string; serialNumber: string; move: DueMove }[] {
  const rows = engineRowsOf(tx, scope);
  const fresh = computeDueBases(tx, scope, rows);
  const kept = new Map(dueBasesOf(tx, scope).map((row) => [row.engineId, row]));
  const bookings = new Map(bookingsOf(tx, scope).map((booking) => [booking.engineId, booking]));
  const now = ctx.now();
  const moves: { engineId: string; serialNumber: string; move: DueMove }[] = [];
  for (const engine of rows) {
    const basis = fresh.get(engine.id)!;
    const before = kept.get(engine.id);
    const from = dueOf(before?.basis);
    const to = dueOf(basis);
    let lastMove = before?.lastMove ?? null;
    if (before && reason !== null && !sameDue(from, to)) {
      const booking = bookings.get(engine.id);
      const earlier = to?.dueDate != null && (from?.dueDate == null || to.dueDate < from.dueDate);
      lastMove = {
        from,
        to,
        reason,
        at: now.toISOString(),
        bookingOverrun: Boolean(booking && earlier && booking.plannedDate > to!.dueDate!),
      };
      moves.push({ engineId: engine.id, serialNumber: engine.serialNumber, move: lastMove });
      if (lastMove.bookingOverrun) alertBookingOverrun(ctx, tx, engine, booking!, lastMove);
    }
    saveDueBasis(tx, { engineId: engine.id, basis, lastMove, computedAt: now });
  }
  return moves;
}

function alertBookingOverrun(
  ctx: Pick<AppContext, 'config' | 'now'>,
  tx: DbOrTx,
  engine: EngineDueRow,
  booking: { plannedDate: string; note: string },
  move: DueMove,
): void {
  const planners = listActiveHomeUsers(tx, permissionGrants['plan:inspection']);
  if (planners.length === 0) return;
  queueMail(ctx, tx, {
    kind: 'reminder',
    ...bookingOverrunEmail({
      to: planners.map((user) => user.email),
      engineSerialNumber: engine.serialNumber,
      plannedDate: booking.plannedDate,
      move,
      link: `${publicOrigin(ctx.config.publicOrigins, ctx.config.port)}/engines/${engine.id}`,
    }),
    record: { type: 'engine', id: engine.id, label: `Engine ${engine.serialNumber}` },
  });
}

/**
 * The kept due bases of the engines of a read; an engine without one yet (new, or kept before
 * bases were) has it computed and kept now.
 */
export function readDueBases(
  ctx: Pick<AppContext, 'now'>,
  db: DbOrTx,
  rows: readonly EngineDueRow[],
  scope: EngineScope,
): Map<string, { basis: DueBasis; lastMove: DueMove | null }> {
  const kept = new Map(
    dueBasesOf(db, scope).map((row) => [
      row.engineId,
      { basis: row.basis, lastMove: row.lastMove },
    ]),
  );
  const missing = rows.filter((row) => !kept.has(row.id));
  if (missing.length > 0) {
    const computed = computeDueBases(
      db,
      missing.length > 500 ? scope : { engineIds: missing.map((row) => row.id) },
      missing,
    );
    const now = ctx.now();
    for (const [engineId, basis] of computed) {
      saveDueBasis(db, { engineId, basis, lastMove: null, computedAt: now });
      kept.set(engineId, { basis, lastMove: null });
    }
  }
  return kept;
}
