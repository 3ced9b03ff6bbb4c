import { and, count, desc, eq, inArray, sql } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import {
  engineModels,
  engines,
  inspections,
  organisations,
  reports,
  signatures,
} from '../../db/schema';

export type ReportRow = typeof reports.$inferSelect;

export function insertReport(db: DbOrTx, row: typeof reports.$inferInsert): void {
  db.insert(reports).values(row).run();
}

/** A report of an inspection: the revision asked, else the latest. */
export function findReport(
  db: DbOrTx,
  inspectionId: string,
  revision?: number,
): ReportRow | undefined {
  return db
    .select()
    .from(reports)
    .where(
      and(
        eq(reports.inspectionId, inspectionId),
        revision === undefined ? undefined : eq(reports.revision, revision),
      ),
    )
    .orderBy(desc(reports.revision))
    .limit(1)
    .get();
}

/** Every stored report with the content of the release signature that covers it. */
export function reportsWithReleases(db: DbOrTx) {
  return db
    .select({
      id: reports.id,
      inspectionId: reports.inspectionId,
      revision: reports.revision,
      pdf: reports.pdf,
      pdfSha256: reports.pdfSha256,
      releaseContent: signatures.content,
      releaseSeq: signatures.seq,
    })
    .from(reports)
    .leftJoin(signatures, eq(signatures.id, reports.releaseSignatureId))
    .all();
}

/** A report by its verification code, with its inspection's engine and date. */
export function findReportByCode(db: DbOrTx, code: string) {
  return db
    .select({
      id: reports.id,
      inspectionId: reports.inspectionId,
      revision: reports.revision,
      pdf: reports.pdf,
      pdfSha256: reports.pdfSha256,
      releaseSignatureId: reports.releaseSignatureId,
      inspectionDate: inspections.date,
      releaseRevision: inspections.releaseRevision,
      engineSerialNumber: engines.serialNumber,
    })
    .from(reports)
    .innerJoin(inspections, eq(inspections.id, reports.inspectionId))
    .innerJoin(engines, eq(engines.id, inspections.engineId))
    .where(eq(reports.verificationCode, code))
    .get();
}

/** The latest revision of an inspection's report. */
export function latestRevision(db: DbOrTx, inspectionId: string): number {
  return findReport(db, inspectionId)?.revision ?? 0;
}

/** The reports of an inspection, oldest revision first (id and revision only). */
export function reportRevisionsOf(db: DbOrTx, inspectionId: string) {
  return db
    .select({ id: reports.id, revision: reports.revision })
    .from(reports)
    .where(eq(reports.inspectionId, inspectionId))
    .orderBy(reports.revision)
    .all();
}

/** A page of issued reports, newest release first, with their engine and release signature. */
export function listReports(
  db: DbOrTx,
  filter: { organisationId?: string | undefined; engineId?: string | undefined },
  page: { offset: number; limit: number },
) {
  const where = and(
    filter.organisationId ? eq(engines.organisationId, filter.organisationId) : undefined,
    filter.engineId ? eq(inspections.engineId, filter.engineId) : undefined,
  );
  const rows = db
    .select({
      id: reports.id,
      inspectionId: reports.inspectionId,
      revision: reports.revision,
      verificationCode: reports.verificationCode,
      releaseRevision: inspections.releaseRevision,
      inspectionDate: inspections.date,
      reason: inspections.reason,
      engineId: engines.id,
      engineSerialNumber: engines.serialNumber,
      modelName: sql<string>`${engineModels.name} || ' v' || ${engineModels.version}`,
      organisationId: engines.organisationId,
      organisationName: organisations.name,
      releasedAt: signatures.signedAt,
      signer: signatures.signer,
      releaseContent: signatures.content,
    })
    .from(reports)
    .innerJoin(inspections, eq(inspections.id, reports.inspectionId))
    .innerJoin(engines, eq(engines.id, inspections.engineId))
    .innerJoin(engineModels, eq(engineModels.id, engines.modelId))
    .innerJoin(organisations, eq(organisations.id, engines.organisationId))
    .innerJoin(signatures, eq(signatures.id, reports.releaseSignatureId))
    .where(where)
    .orderBy(desc(signatures.seq))
    .limit(page.limit)
    .offset(page.offset)
    .all();
  const total =
    db
      .select({ n: count() })
      .from(reports)
      .innerJoin(inspections, eq(inspections.id, reports.inspectionId))
      .innerJoin(engines, eq(engines.id, inspections.engineId))
      .where(where)
      .get()?.n ?? 0;
  return { rows, total };
}

/** Outcome signatures by their hashes (what release signatures name). */
export function outcomesBySha(db: DbOrTx, shas: readonly string[]) {
  if (shas.length === 0) return [];
  return db
    .select({ sha256: signatures.sha256, content: signatures.content })
    .from(signatures)
    .where(and(eq(signatures.kind, 'outcome'), inArray(signatures.sha256, [...shas])))
    .all();
}
