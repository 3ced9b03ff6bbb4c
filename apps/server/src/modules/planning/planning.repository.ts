import { and, asc, eq, inArray, isNotNull, or, gt } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { findings, inspections, rowCoverage, signatures } from '../../db/schema';

/**
 * The inspections of an engine whose outcome counts for its due status: one signed and current,
 * or, while a correction made after a release waits for the next one, the outcome of that release.
 */
export function signedInspections(db: DbOrTx, engineId: string) {
  return db
    .select({
      id: inspections.id,
      date: inspections.date,
      csn: inspections.csn,
      tsn: inspections.tsn,
      outcomeSignatureId: inspections.outcomeSignatureId,
      releaseSignatureId: inspections.releaseSignatureId,
    })
    .from(inspections)
    .where(
      and(
        eq(inspections.engineId, engineId),
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
