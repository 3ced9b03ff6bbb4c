import { and, asc, desc, eq, max, ne, or, lt, type SQL } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { findings, inspections, limitSets, rowCoverage, users } from '../../db/schema';

export type FindingRecord = typeof findings.$inferSelect;
export type FindingRow = FindingRecord & {
  createdByName: string;
  limitSetRevision: string | null;
};

function selectFindings(db: DbOrTx, where: SQL) {
  return db
    .select({ finding: findings, createdByName: users.name, limitSetRevision: limitSets.revision })
    .from(findings)
    .innerJoin(users, eq(users.id, findings.createdBy))
    .leftJoin(limitSets, eq(limitSets.id, findings.limitSetId))
    .where(where)
    .orderBy(asc(findings.number))
    .all()
    .map((row): FindingRow => ({
      ...row.finding,
      createdByName: row.createdByName,
      limitSetRevision: row.limitSetRevision,
    }));
}

/** Every finding of an inspection, void ones included, in the order recorded. */
export function listFindings(db: DbOrTx, inspectionId: string): FindingRow[] {
  return selectFindings(db, eq(findings.inspectionId, inspectionId));
}

export function findFinding(db: DbOrTx, id: string): FindingRow | undefined {
  return selectFindings(db, eq(findings.id, id))[0];
}

export function nextFindingNumber(db: DbOrTx, inspectionId: string): number {
  const row = db
    .select({ n: max(findings.number) })
    .from(findings)
    .where(eq(findings.inspectionId, inspectionId))
    .get();
  return (row?.n ?? 0) + 1;
}

export function insertFinding(db: DbOrTx, row: typeof findings.$inferInsert): void {
  db.insert(findings).values(row).run();
}

export function updateFinding(
  db: DbOrTx,
  id: string,
  changes: Partial<typeof findings.$inferInsert>,
): void {
  db.update(findings).set(changes).where(eq(findings.id, id)).run();
}

export function storeEvaluation(
  db: DbOrTx,
  id: string,
  stored: Pick<FindingRecord, 'evaluation' | 'category' | 'limitSetId' | 'evaluatedAt'>,
): void {
  db.update(findings).set(stored).where(eq(findings.id, id)).run();
}

/** Recorded findings of earlier inspections of an engine, newest inspection first. */
export function earlierFindings(
  db: DbOrTx,
  engineId: string,
  before: { inspectionId: string; date: string; createdAt: Date },
  match: { row: string; position: number; damage: string; zone?: string },
) {
  const conditions = [
    eq(inspections.engineId, engineId),
    ne(inspections.id, before.inspectionId),
    or(
      lt(inspections.date, before.date),
      and(eq(inspections.date, before.date), lt(inspections.createdAt, before.createdAt)),
    )!,
    eq(findings.status, 'recorded'),
    eq(findings.rowKey, match.row),
    eq(findings.position, match.position),
    eq(findings.damage, match.damage),
  ];
  if (match.zone) conditions.push(eq(findings.zone, match.zone));
  return db
    .select({ finding: findings, inspection: inspections })
    .from(findings)
    .innerJoin(inspections, eq(inspections.id, findings.inspectionId))
    .where(and(...conditions))
    .orderBy(desc(inspections.date), desc(inspections.createdAt), asc(findings.number))
    .all();
}

/** The findings of one damage series, oldest inspection first. */
export function seriesFindings(db: DbOrTx, seriesId: string) {
  return db
    .select({ finding: findings, inspection: inspections })
    .from(findings)
    .innerJoin(inspections, eq(inspections.id, findings.inspectionId))
    .where(and(eq(findings.seriesId, seriesId), eq(findings.status, 'recorded')))
    .orderBy(asc(inspections.date), asc(inspections.createdAt))
    .all();
}

export type CoverageRecord = typeof rowCoverage.$inferSelect;

export function listCoverage(db: DbOrTx, inspectionId: string): CoverageRecord[] {
  return db.select().from(rowCoverage).where(eq(rowCoverage.inspectionId, inspectionId)).all();
}

export function upsertCoverage(db: DbOrTx, row: CoverageRecord): void {
  const { inspectionId: _inspection, rowKey: _row, ...changes } = row;
  db.insert(rowCoverage)
    .values(row)
    .onConflictDoUpdate({ target: [rowCoverage.inspectionId, rowCoverage.rowKey], set: changes })
    .run();
}

/** Findings that continue this one (in later inspections). */
export function listSuccessors(db: DbOrTx, findingId: string): FindingRecord[] {
  return db.select().from(findings).where(eq(findings.previousFindingId, findingId)).all();
}
