import { createHash, randomBytes } from 'node:crypto';
import type { ReportFileCheck, ReportVerification } from '@emberline/contracts/reports';
import type { AppContext } from '../../context';
import { AppError } from '../../http/app-error';
import type { Principal } from '../../http/principal';
import { publicOrigin } from '../auth/auth.service';
import { visibleInspection } from '../inspections/inspection-access';
import { createRateLimiter } from '../../http/rate-limit';
import { findSignatures } from '../records/records.repository';
import { sealHolds } from '../records/signature-chain';
import { findReport, findReportByCode, latestRevision } from './reports.repository';

/** A verification code: 128 random bits, base64url (22 characters). */
export function newVerificationCode(): string {
  return randomBytes(16).toString('base64url');
}

/** The file name a report downloads and is attached under. */
export function reportFilename(engineSerialNumber: string, date: string, revision: number): string {
  return `emberline-${engineSerialNumber}-${date}-rev${revision}.pdf`;
}

export function verifyUrlOf(ctx: Pick<AppContext, 'config'>, code: string): string {
  return `${publicOrigin(ctx.config.publicOrigins, ctx.config.port)}/verify/${code}`;
}

export function createReportsService(ctx: AppContext) {
  const { db } = ctx;
  // Public checks: 30 a minute from one address.
  const limiter = createRateLimiter({ limit: 30, windowMs: 60_000, now: ctx.now });

  /** The report of a code, with whether it is genuine and current; 404 for an unknown code. */
  function verified(code: string, ip: string) {
    limiter.take(ip);
    const report = findReportByCode(db, code);
    if (!report) throw AppError.notFound('No Emberline report has this verification code.');
    const release = findSignatures(db, [report.releaseSignatureId])[0];
    const signed = (release?.content as { report?: { pdfSha256: string; revision: number } })
      ?.report;
    const genuine =
      Boolean(release && sealHolds(ctx.recordsKey.key, release)) &&
      createHash('sha256').update(report.pdf).digest('hex') === report.pdfSha256 &&
      signed?.pdfSha256 === report.pdfSha256 &&
      signed.revision === report.revision;
    const current =
      report.revision === latestRevision(db, report.inspectionId) &&
      report.releaseRevision === report.revision;
    return { report, genuine, current };
  }

  return {
    /** What a code tells anyone: genuine and current or not, the engine, the day, the revision. */
    verify(code: string, ip: string): ReportVerification {
      const { report, genuine, current } = verified(code, ip);
      return {
        genuine,
        current,
        engineSerialNumber: report.engineSerialNumber,
        inspectionDate: report.inspectionDate,
        revision: report.revision,
        message: !genuine
          ? 'This report does not check out: its stored copy or its signature has been changed. Do not rely on it; ask the issuer.'
          : current
            ? 'Genuine and current: this is the signed report as issued, and no later revision replaces it.'
            : 'Genuine, but replaced: a later revision of this report was issued. Ask for the current one.',
      };
    },

    /** Whether a file is, byte for byte, the stored report of the code. */
    checkFile(code: string, ip: string, bytes: Buffer): ReportFileCheck {
      const { report, genuine } = verified(code, ip);
      const matches =
        genuine && createHash('sha256').update(bytes).digest('hex') === report.pdfSha256;
      return {
        matches,
        message: matches
          ? 'The file is the signed report, byte for byte.'
          : 'The file is not the signed report of this code: it differs from the copy on record.',
      };
    },

    /**
     * The stored PDF of a released inspection the caller may see (the latest revision, or the one
     * asked); 404 for an unreleased inspection or another organisation's.
     */
    pdf(principal: Principal, inspectionId: string, revision?: number) {
      const inspection = visibleInspection(db, principal, inspectionId);
      const report =
        inspection.releaseRevision > 0 ? findReport(db, inspection.id, revision) : undefined;
      if (!report) throw AppError.notFound('This inspection has no released report.');
      return {
        bytes: report.pdf,
        filename: reportFilename(inspection.engineSerialNumber, inspection.date, report.revision),
      };
    },
  };
}
