import { and, desc, eq } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { engines, inspections, reports, signatures } from '../../db/schema';

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
