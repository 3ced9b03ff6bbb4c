import { randomBytes } from 'node:crypto';
import type { AppContext } from '../../context';
import { AppError } from '../../http/app-error';
import type { Principal } from '../../http/principal';
import { publicOrigin } from '../auth/auth.service';
import { visibleInspection } from '../inspections/inspection-access';
import { findReport } from './reports.repository';

/** A verification code: 128 random bits, base64url (22 characters). */
export function newVerificationCode(): string {
  return randomBytes(16).toString('base64url');
}

export function verifyUrlOf(ctx: Pick<AppContext, 'config'>, code: string): string {
  return `${publicOrigin(ctx.config.publicOrigins, ctx.config.port)}/verify/${code}`;
}

export function createReportsService(ctx: AppContext) {
  const { db } = ctx;
  return {
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
        filename: `emberline-${inspection.engineSerialNumber}-${inspection.date}-rev${report.revision}.pdf`,
      };
    },
  };
}
