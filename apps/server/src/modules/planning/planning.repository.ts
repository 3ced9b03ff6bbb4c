import { and, asc, eq, inArray, isNotNull, or, gt } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import {
  bookings,
  engines,
  findings,
  inspections,
  rowCoverage,
  signatures,
  users,
  utilizationRecords,
} from '../../db/schema';

/**
 * The inspections of an engine whose outcome counts for its due status: one signed and current,
 * or, while a correction made after a release waits for the next one, the outcome of that release.
 */
export function signedInspections(db: DbOrTx, engineIds: readonly string[]) {
  if (engineIds.length === 0) return [];
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
    .where(
      and(
        inArray(inspections.engineId, [...engineIds]),
        or(isNotNull(inspections.outcomeSignatureId), gt(inspections.releaseRevision, 0)),
      ),
    )
    .orderBy(asc(inspections.date), asc(inspections.csn))
    .all();
}

export function signaturesById(db: DbOrTx, ids: readonly string[]) {
  if (ids.length === 0) return [];
  return db
    .select({
      id: signatures.id,
      sha256: signatures.sha256,
      signedAt: signatures.signedAt,
      content: signatures.content,
      kind: signatures.kind,
      subjectId: signatures.subjectId,
    })
    .from(signatures)
    .where(inArray(signatures.id, [...ids]))
    .all();
}

export function outcomeSignaturesOf(db: DbOrTx, inspectionIds: readonly string[]) {
  if (inspectionIds.length === 0) return [];
  return db
    .select({
      id: signatures.id,
      sha256: signatures.sha256,
      signedAt: signatures.signedAt,
      content: signatures.content,
      subjectId: signatures.subjectId,
    })
    .from(signatures)
    .where(and(eq(signatures.kind, 'outcome'), inArray(signatures.subjectId, [...inspectionIds])))
    .all();
}

export function coverageOfInspections(db: DbOrTx, inspectionIds: readonly string[]) {
  if (inspectionIds.length === 0) return [];
  return db
    .select({
      inspectionId: rowCoverage.inspectionId,
      row: rowCoverage.rowKey,
      status: rowCoverage.status,
      viewedPositions: rowCoverage.viewedPositions,
    })
    .from(rowCoverage)
    .where(inArray(rowCoverage.inspectionId, [...inspectionIds]))
    .all();
}

export function findingPlaces(db: DbOrTx, findingIds: readonly string[]) {
  if (findingIds.length === 0) return [];
  return db
    .select({
      id: findings.id,
      row: findings.rowKey,
      position: findings.position,
      seriesId: findings.seriesId,
    })
    .from(findings)
    .where(inArray(findings.id, [...findingIds]))
    .all();
}

export function utilizationOf(db: DbOrTx, engineIds: readonly string[]) {
  if (engineIds.length === 0) return [];
  return db
    .select({
      engineId: utilizationRecords.engineId,
      periodStart: utilizationRecords.periodStart,
      periodEnd: utilizationRecords.periodEnd,
      cycles: utilizationRecords.cycles,
      hours: utilizationRecords.hours,
    })
    .from(utilizationRecords)
    .where(inArray(utilizationRecords.engineId, [...engineIds]))
    .all();
}

export function bookingsOf(db: DbOrTx, engineIds: readonly string[]) {
  if (engineIds.length === 0) return [];
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
    .innerJoin(users, eq(users.id, bookings.bookedBy))
    .where(inArray(bookings.engineId, [...engineIds]))
    .all();
}

export function upsertBooking(db: DbOrTx, row: typeof bookings.$inferInsert): void {
  const { engineId: _engine, ...changes } = row;
  db.insert(bookings)
    .values(row)
    .onConflictDoUpdate({ target: bookings.engineId, set: changes })
    .run();
}

/** The engines a planning read covers, with what the due status needs of each. */
export function planningEngines(
  db: DbOrTx,
  filter: { organisationId?: string | undefined; modelId?: string | undefined },
) {
  const conditions = [];
  if (filter.organisationId) conditions.push(eq(engines.organisationId, filter.organisationId));
  if (filter.modelId) conditions.push(eq(engines.modelId, filter.modelId));
  return db
    .select({ id: engines.id })
    .from(engines)
    .where(conditions.length ? and(...conditions) : undefined)
    .orderBy(asc(engines.serialNumber))
    .all()
    .map((row) => row.id);
}
