import { and, asc, eq, gt, inArray, isNotNull, or, type SQL } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import {
  bookings,
  engineDue,
  engines,
  findings,
  inspections,
  rowCoverage,
  signatures,
  users,
  utilizationRecords,
} from '../../db/schema';

/**
 * Which engines a planning read covers: one engine, or the fleet narrowed by owner and model.
 * Every read below joins the engines and filters with it, so that the whole fleet is read in one
 * query a kind of row, never through a list of thousands of ids.
 */
export interface EngineScope {
  engineId?: string | undefined;
  /** A page of engines (a list screen's): a short list. */
  engineIds?: readonly string[] | undefined;
  organisationId?: string | undefined;
  modelId?: string | undefined;
}

function scopeOf(scope: EngineScope): SQL | undefined {
  const conditions: SQL[] = [];
  if (scope.engineId) conditions.push(eq(engines.id, scope.engineId));
  if (scope.engineIds) conditions.push(inArray(engines.id, [...scope.engineIds]));
  if (scope.organisationId) conditions.push(eq(engines.organisationId, scope.organisationId));
  if (scope.modelId) conditions.push(eq(engines.modelId, scope.modelId));
  return conditions.length ? and(...conditions) : undefined;
}

/** An inspection whose outcome counts: one signed and current, or one released before. */
const signed = or(isNotNull(inspections.outcomeSignatureId), gt(inspections.releaseRevision, 0));

export function signedInspections(db: DbOrTx, scope: EngineScope) {
  return db
    .select({
      id: inspections.id,
      engineId: inspections.engineId,
      date: inspections.date,
      csn: inspections.csn,
      tsn: inspections.tsn,
      outcomeSignatureId: inspections.outcomeSignatureId,
      releaseSignatureId: inspections.releaseSignatureId,
    })
    .from(inspections)
    .innerJoin(engines, eq(engines.id, inspections.engineId))
    .where(and(scopeOf(scope), signed))
    .orderBy(asc(inspections.date), asc(inspections.csn))
    .all();
}

/** The outcome signatures of the signed inspections in scope (every one, current or not). */
export function outcomeSignaturesOf(db: DbOrTx, scope: EngineScope) {
  return db
    .select({
      id: signatures.id,
      sha256: signatures.sha256,
      signedAt: signatures.signedAt,
      content: signatures.content,
      subjectId: signatures.subjectId,
    })
    .from(inspections)
    .innerJoin(engines, eq(engines.id, inspections.engineId))
    .innerJoin(
      signatures,
      and(eq(signatures.kind, 'outcome'), eq(signatures.subjectId, inspections.id)),
    )
    .where(and(scopeOf(scope), signed))
    .all();
}

/** The current release signatures of the inspections in scope. */
export function releaseSignaturesOf(db: DbOrTx, scope: EngineScope) {
  return db
    .select({ subjectId: signatures.subjectId, content: signatures.content })
    .from(inspections)
    .innerJoin(engines, eq(engines.id, inspections.engineId))
    .innerJoin(signatures, eq(signatures.id, inspections.releaseSignatureId))
    .where(scopeOf(scope))
    .all();
}

export function coverageOfInspections(db: DbOrTx, scope: EngineScope) {
  return db
    .select({
      inspectionId: rowCoverage.inspectionId,
      row: rowCoverage.rowKey,
      status: rowCoverage.status,
      viewedPositions: rowCoverage.viewedPositions,
    })
    .from(inspections)
    .innerJoin(engines, eq(engines.id, inspections.engineId))
    .innerJoin(rowCoverage, eq(rowCoverage.inspectionId, inspections.id))
    .where(and(scopeOf(scope), signed))
    .all();
}

/** Where each recorded finding of the signed inspections in scope is, and its damage series. */
export function findingPlaces(db: DbOrTx, scope: EngineScope) {
  return db
    .select({
      id: findings.id,
      row: findings.rowKey,
      position: findings.position,
      seriesId: findings.seriesId,
    })
    .from(inspections)
    .innerJoin(engines, eq(engines.id, inspections.engineId))
    .innerJoin(findings, eq(findings.inspectionId, inspections.id))
    .where(and(scopeOf(scope), signed, eq(findings.status, 'recorded')))
    .all();
}

export function utilizationOf(db: DbOrTx, scope: EngineScope) {
  return db
    .select({
      engineId: utilizationRecords.engineId,
      periodStart: utilizationRecords.periodStart,
      periodEnd: utilizationRecords.periodEnd,
      cycles: utilizationRecords.cycles,
      hours: utilizationRecords.hours,
    })
    .from(utilizationRecords)
    .innerJoin(engines, eq(engines.id, utilizationRecords.engineId))
    .where(scopeOf(scope))
    .all();
}

export function bookingsOf(db: DbOrTx, scope: EngineScope) {
  return db
    .select({
      engineId: bookings.engineId,
      plannedDate: bookings.plannedDate,
      note: bookings.note,
      dueDateAtBooking: bookings.dueDateAtBooking,
      bookedAt: bookings.bookedAt,
      bookedByName: users.name,
    })
    .from(bookings)
    .innerJoin(engines, eq(engines.id, bookings.engineId))
    .innerJoin(users, eq(users.id, bookings.bookedBy))
    .where(scopeOf(scope))
    .all();
}

export function upsertBooking(db: DbOrTx, row: typeof bookings.$inferInsert): void {
  const { engineId: _engine, ...changes } = row;
  db.insert(bookings)
    .values(row)
    .onConflictDoUpdate({ target: bookings.engineId, set: changes })
    .run();
}

/** The recorded findings of some damage series, with the CSN of their inspections. */
export function seriesPoints(db: DbOrTx, seriesIds: readonly string[]) {
  if (seriesIds.length === 0) return [];
  return db
    .select({
      id: findings.id,
      seriesId: findings.seriesId,
      inspectionId: findings.inspectionId,
      inspectionState: inspections.state,
      csn: inspections.csn,
      date: inspections.date,
      lengthMm: findings.lengthMm,
      areaMm2: findings.areaMm2,
      uncertaintyMm: findings.uncertaintyMm,
      uncertaintyMm2: findings.uncertaintyMm2,
      evaluation: findings.evaluation,
      limitSetId: findings.limitSetId,
    })
    .from(findings)
    .innerJoin(inspections, eq(inspections.id, findings.inspectionId))
    .where(and(inArray(findings.seriesId, [...seriesIds]), eq(findings.status, 'recorded')))
    .orderBy(asc(inspections.csn))
    .all();
}

/** The kept due bases of the engines in scope. */
export function dueBasesOf(db: DbOrTx, scope: EngineScope) {
  return db
    .select({
      engineId: engineDue.engineId,
      basis: engineDue.basis,
      lastMove: engineDue.lastMove,
    })
    .from(engineDue)
    .innerJoin(engines, eq(engines.id, engineDue.engineId))
    .where(scopeOf(scope))
    .all();
}

export function saveDueBasis(db: DbOrTx, row: typeof engineDue.$inferInsert): void {
  const { engineId: _engine, ...changes } = row;
  db.insert(engineDue)
    .values(row)
    .onConflictDoUpdate({ target: engineDue.engineId, set: changes })
    .run();
}
