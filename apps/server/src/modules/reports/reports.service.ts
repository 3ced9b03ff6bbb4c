import { createHash, randomBytes } from 'node:crypto';
import type {
  Delivery,
  DeliveryLog,
  DeliveryState,
  ParsedReportListQuery,
  ReportFileCheck,
  ReportListResponse,
  ReportVerification,
  UndeliveredUrgentNotice,
} from '@emberline/contracts/reports';
import { decisionSchema } from '@emberline/contracts/review';
import { decisionOutcome } from '@emberline/domain/decisions';
import type { outcomeContent, releaseContent } from '@emberline/domain/signature-content';
import {
  listMessagesAbout,
  listUndelivered,
  type OutboxRow,
} from '../../lib/email/outbox.repository';
import { recordScope } from '../../http/record-access';
import { findEngineRow } from '../engines/engines.repository';
import { findInspection } from '../inspections/inspections.repository';
import type { AppContext } from '../../context';
import { AppError } from '../../http/app-error';
import type { Principal } from '../../http/principal';
import { publicOrigin } from '../auth/auth.service';
import { visibleInspection } from '../inspections/inspection-access';
import { findSignatures } from '../records/records.repository';
import { sealHolds } from '../records/signature-chain';
import {
  findReport,
  findReportByCode,
  latestRevision,
  listReports,
  outcomesBySha,
  reportRevisionsOf,
} from './reports.repository';

/** A message of an inspection's delivery log, as its owner and staff read it. */
function toDelivery(row: OutboxRow, revisions: ReadonlyMap<string, number>): Delivery {
  return {
    id: row.id,
    kind: row.kind === 'urgent' ? 'urgent' : 'report',
    revision: row.recordType === 'report' ? (revisions.get(row.recordId ?? '') ?? null) : null,
    subject: row.subject,
    recipients: row.recipients,
    state: row.state,
    attempts: row.attempts,
    lastError: row.lastError,
    nextAttemptAt: row.nextAttemptAt?.toISOString() ?? null,
    sentAt: row.sentAt?.toISOString() ?? null,
    createdAt: row.createdAt.toISOString(),
  };
}

/** Where a report's messages stand, the worst first. */
function deliveryState(messages: readonly OutboxRow[]): DeliveryState {
  if (messages.length === 0) return 'none';
  if (messages.some((message) => message.state === 'needs-attention')) return 'needs-attention';
  if (messages.some((message) => message.state === 'failed')) return 'failed';
  if (messages.some((message) => message.state !== 'sent')) return 'on-its-way';
  return 'sent';
}

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

  /** The report of a code, with whether it is genuine and current; 404 for an unknown code. */
  function verified(code: string) {
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
    verify(code: string): ReportVerification {
      const { report, genuine, current } = verified(code);
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
    checkFile(code: string, bytes: Buffer): ReportFileCheck {
      const { report, genuine } = verified(code);
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
     * The issued reports the caller may see, newest release first: customers their own
     * organisation's, staff every one (filtered by owner or engine).
     */
    list(principal: Principal, query: ParsedReportListQuery): ReportListResponse {
      const scope = recordScope(principal);
      const { rows, total } = listReports(
        db,
        { organisationId: scope.organisationId ?? query.organisationId, engineId: query.engineId },
        { offset: (query.page - 1) * query.pageSize, limit: query.pageSize },
      );
      type ReleaseContent = ReturnType<typeof releaseContent>;
      const outcomes = new Map(
        outcomesBySha(
          db,
          rows.map((row) => (row.releaseContent as ReleaseContent).outcomeSignatureSha256),
        ).map((outcome) => [outcome.sha256, outcome.content as ReturnType<typeof outcomeContent>]),
      );
      const messages = listMessagesAbout(db, [{ type: 'report', ids: rows.map((row) => row.id) }]);
      return {
        items: rows.map((row) => {
          const outcome = outcomes.get(
            (row.releaseContent as ReleaseContent).outcomeSignatureSha256,
          );
          return {
            inspectionId: row.inspectionId,
            engineId: row.engineId,
            engineSerialNumber: row.engineSerialNumber,
            modelName: row.modelName,
            organisationId: row.organisationId,
            organisationName: row.organisationName,
            inspectionDate: row.inspectionDate,
            reason: row.reason,
            revision: row.revision,
            current: row.revision === row.releaseRevision,
            releasedAt: row.releasedAt,
            releasedByName: row.signer.name,
            outcome: decisionOutcome(
              (outcome?.dispositions ?? []).map((item) => decisionSchema.parse(item.decision)),
            ).kind,
            verificationCode: row.verificationCode,
            delivery: deliveryState(messages.filter((message) => message.recordId === row.id)),
          };
        }),
        total,
      };
    },

    /**
     * The delivery log of an inspection: each report revision's e-mail and every urgent notice to
     * its owner, with recipients, attempts and errors (404 where the inspection is not visible).
     */
    deliveries(principal: Principal, inspectionId: string): DeliveryLog['items'] {
      const inspection = visibleInspection(db, principal, inspectionId);
      const revisions = reportRevisionsOf(db, inspection.id);
      const byId = new Map(revisions.map((report) => [report.id, report.revision]));
      const messages = listMessagesAbout(db, [
        { type: 'report', ids: revisions.map((report) => report.id) },
        { type: 'inspection', ids: [inspection.id], kinds: ['urgent'] },
      ]);
      return messages.map((message) => toDelivery(message, byId));
    },

    /**
     * Urgent notices (remove before the next flight) that have not reached the owner: shown to
     * the engineers at once, so that someone telephones the owner.
     */
    undeliveredUrgent(): UndeliveredUrgentNotice[] {
      return listUndelivered(db, 'urgent').flatMap((message) => {
        const inspection = message.recordId ? findInspection(db, message.recordId) : undefined;
        const engine = inspection && findEngineRow(db, inspection.engineId);
        if (!inspection || !engine) return [];
        return [
          {
            ...toDelivery(message, new Map()),
            inspectionId: inspection.id,
            engineId: inspection.engineId,
            engineSerialNumber: inspection.engineSerialNumber,
            organisationName: engine.organisationName,
            inspectionDate: inspection.date,
          },
        ];
      });
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
