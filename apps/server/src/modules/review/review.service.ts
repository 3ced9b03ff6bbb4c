import { createHash } from 'node:crypto';
import { dayWords } from '@emberline/domain/dates';
import { removalKindWords } from '@emberline/domain/decision-words';
import { dueWords } from '@emberline/domain/due-status';
import type { InspectionFlag } from '@emberline/contracts/inspections';
import type { BeyondAction, Category, FindingEvaluation } from '@emberline/contracts/limits';
import {
  decisionSchema,
  type Disposition,
  type InspectionReview,
  type ParsedDispositionInput,
  type ParsedOutcomeInput,
  type ReviewQueueItem,
  type ReviewQueueQuery,
  type SignatureSummary,
} from '@emberline/contracts/review';
import { authorityToSign } from '@emberline/domain/authority';
import { decisionOutcome, isConcession } from '@emberline/domain/decisions';
import { severity, worse } from '@emberline/domain/limits';
import {
  dispositionContent,
  outcomeContent,
  releaseContent,
  withdrawalContent,
  type Signer,
} from '@emberline/domain/signature-content';
import type { AppContext, RequestMeta } from '../../context';
import { inTransaction, type DbOrTx } from '../../db/client';
import { AppError } from '../../http/app-error';
import type { Principal } from '../../http/principal';
import { recordScope } from '../../http/record-access';
import { newId } from '../../lib/ids';
import { appendAudit } from '../audit/audit.repository';
import { confirmPassword } from '../auth/password-check';
import { coverageOf } from '../coverage/coverage.service';
import { findFinding, type FindingRecord } from '../findings/findings.repository';
import { findImageMeta } from '../images/images.repository';
import { inspectionModelRows, visibleInspection } from '../inspections/inspection-access';
import {
  findInspection,
  setInspectionState,
  type InspectionRow,
} from '../inspections/inspections.repository';
import { toInspection } from '../inspections/inspections.service';
import { findLimitSet } from '../limit-sets/limit-sets.repository';
import { appendSignature } from '../records/signature-writer';
import { findSignatures, signaturesOf } from '../records/records.repository';
import type { SignatureRecord } from '../records/signature-chain';
import { findUserById } from '../users/users.repository';
import { alertRemovalOrdered } from './review-alerts';
import { refreshDue } from '../planning/due-basis';
import { createPlanningService } from '../planning/planning.service';
import { buildReport } from '../reports/report-builder';
import { findReport, insertReport } from '../reports/reports.repository';
import { reportEmail } from '../reports/report-emails';
import { contactsFor } from '../organisations/organisations.repository';
import { findEngineRow } from '../engines/engines.repository';
import { queueMail } from '../../lib/email/outbox';
import { publicOrigin } from '../auth/auth.service';
import { newVerificationCode, reportFilename, verifyUrlOf } from '../reports/reports.service';
import {
  changedFinding,
  currentDisposition,
  endDispositions,
  findDisposition,
  flagsAcknowledgedBy,
  insertDisposition,
  isContinued,
  listDispositions,
  listReviewInspections,
  previousDispositionedInspection,
  recordedFindingsOf,
  type DispositionRecord,
} from './review.repository';

export function toSignatureSummary(record: SignatureRecord): SignatureSummary {
  return {
    id: record.id,
    seq: record.seq,
    kind: record.kind,
    signerName: record.signer.name,
    signerRole: record.signer.role,
    authorisationRef: record.signer.authorisationRef,
    signedAt: record.signedAt,
    meaning: record.meaning,
    sha256: record.sha256,
  };
}

const verdictOf = (finding: FindingRecord) =>
  (finding.evaluation as unknown as FindingEvaluation | null) ?? null;

/**
 * What a disposition covers, rebuilt from the rows (DESIGN §5.5): the signer builds it before
 * signing and the records check rebuilds it from the live rows, so that a change shows.
 */
export function dispositionSubject(
  db: DbOrTx,
  finding: FindingRecord,
  disposition: Pick<
    DispositionRecord,
    | 'decision'
    | 'rationale'
    | 'concession'
    | 'concessionRef'
    | 'supersedesId'
    | 'supersedeReason'
    | 'recurrence'
  >,
) {
  const evaluation = verdictOf(finding);
  const limitSet = finding.limitSetId ? findLimitSet(db, finding.limitSetId) : undefined;
  return dispositionContent({
    finding: {
      id: finding.id,
      number: finding.number,
      inspectionId: finding.inspectionId,
      imageSha256: findImageMeta(db, finding.imageId)?.sha256 ?? '',
      shape: finding.shape,
      calibration: finding.calibration ?? null,
      row: finding.rowKey,
      position: finding.position,
      zone: finding.zone,
      damage: finding.damage,
      method: finding.method,
      lengthMm: finding.lengthMm,
      areaMm2: finding.areaMm2,
      perimeterMm: finding.perimeterMm,
      maxExtentMm: finding.maxExtentMm,
      widthMm: finding.widthMm,
      depthMm: finding.depthMm,
      count: finding.count,
      uncertaintyMm: finding.uncertaintyMm,
      uncertaintyMm2: finding.uncertaintyMm2,
    },
    evaluation: {
      category: evaluation?.category ?? 'review',
      measuredCategory: evaluation?.measuredCategory ?? 'review',
      indeterminate: evaluation?.indeterminate ?? false,
      ruleId: evaluation?.ruleId ?? null,
      reasons: evaluation?.reasons ?? [],
      repeatInterval: evaluation?.repeatInterval ?? null,
      beyondAction: evaluation?.beyondAction ?? null,
    },
    decision: decisionSchema.parse(disposition.decision),
    rationale: disposition.rationale,
    concession: disposition.concession,
    concessionRef: disposition.concessionRef,
    supersedesId: disposition.supersedesId,
    supersedeReason: disposition.supersedeReason,
    recurrence: disposition.recurrence ?? null,
    limitSet: limitSet
      ? {
          id: limitSet.id,
          revision: limitSet.revision,
          contentSha256: limitSet.contentSha256 ?? '',
        }
      : null,
  });
}

const verdictForDecision = (evaluation: FindingEvaluation | null) => ({
  category: evaluation?.category ?? ('review' as Category),
  repeatInterval: evaluation?.repeatInterval ?? null,
  beyondAction: evaluation?.beyondAction ?? null,
});

/**
 * `options.confirmPassword` replaces the password check for trusted code that signs without a
 * person at the keyboard (the demo loader); every request goes through the real one.
 */
export function createReviewService(
  ctx: AppContext,
  options: { confirmPassword?: typeof confirmPassword } = {},
) {
  const { db } = ctx;
  const checkPassword = options.confirmPassword ?? confirmPassword;
  const planning = createPlanningService(ctx);
  const today = () => ctx.now().toISOString().slice(0, 10);

  /** The signer as the record names them, once their authority for the model is checked (403). */
  function signerFor(principal: Principal, inspection: InspectionRow): Signer {
    const user = findUserById(db, principal.user.id);
    const authority = authorityToSign(user?.authorisation ?? null, inspection.modelId, today());
    if ('refused' in authority) throw AppError.forbidden(authority.refused);
    return {
      id: principal.user.id,
      name: principal.user.name,
      role: principal.user.role,
      authorisationRef: authority.ref,
    };
  }

  function toDisposition(
    record: DispositionRecord & { findingNumber: number },
    signature: SignatureRecord,
  ): Disposition {
    return {
      id: record.id,
      findingId: record.findingId,
      findingNumber: record.findingNumber,
      inspectionId: record.inspectionId,
      decision: decisionSchema.parse(record.decision),
      rationale: record.rationale,
      concession: record.concession,
      concessionRef: record.concessionRef,
      supersedesId: record.supersedesId,
      supersedeReason: record.supersedeReason,
      recurrence: record.recurrence ?? null,
      state: record.state,
      current: record.state === 'current',
      signature: toSignatureSummary(signature),
    };
  }

  /** What is left before the outcome can be signed: findings, flags and coverage gaps. */
  function leftToDo(inspection: InspectionRow) {
    const recorded = recordedFindingsOf(db, inspection.id);
    const decided = new Set(
      listDispositions(db, inspection.id)
        .filter((item) => item.state === 'current')
        .map((item) => item.findingId),
    );
    const coverage = coverageOf(db, inspection, inspectionModelRows(db, inspection));
    return {
      recorded,
      findings: recorded
        .filter((finding) => !decided.has(finding.id))
        .map((finding) => ({ findingId: finding.id, number: finding.number })),
      flags: (inspection.flags as InspectionFlag[]).map((flag) => ({
        code: flag.code,
        message: flag.message,
      })),
      coverageGaps: coverage.filter((row) => row.gap).map((row) => row.label),
    };
  }

  /**
   * A finding at the same row, position, zone and damage in the engine's previous dispositioned
   * inspection, for a finding not linked to an earlier one: possibly the same damage again.
   */
  function recurrences(inspection: InspectionRow, recorded: FindingRecord[]) {
    const previous = previousDispositionedInspection(db, inspection.engineId, inspection);
    if (!previous) return [];
    const earlier = recordedFindingsOf(db, previous.id);
    return recorded.flatMap((finding) => {
      if (finding.previousFindingId) return [];
      const candidate = earlier.find(
        (item) =>
          item.rowKey === finding.rowKey &&
          item.position === finding.position &&
          item.zone === finding.zone &&
          item.damage === finding.damage &&
          !isContinued(db, item.id),
      );
      return candidate
        ? [
            {
              findingId: finding.id,
              candidateFindingId: candidate.id,
              candidateNumber: candidate.number,
              candidateInspectionId: previous.id,
              candidateInspectionDate: previous.date,
            },
          ]
        : [];
    });
  }

  /** Why the caller may not sign on this inspection at all, or null. */
  function signingRefusal(principal: Principal, inspection: InspectionRow): string | null {
    const user = findUserById(db, principal.user.id);
    const authority = authorityToSign(user?.authorisation ?? null, inspection.modelId, today());
    return 'refused' in authority ? authority.refused : null;
  }

  function reviewableInspection(principal: Principal, id: string): InspectionRow {
    const inspection = visibleInspection(db, principal, id);
    if (inspection.state === 'void')
      throw AppError.conflict(
        'This inspection was voided: it counts for nothing and takes no review.',
      );
    return inspection;
  }

  return {
    /** Submitted and dispositioned inspections, worst verdict first, then the longest waiting. */
    queue(
      principal: Principal,
      query: Omit<ReviewQueueQuery, 'page' | 'pageSize'>,
    ): ReviewQueueItem[] {
      const scope = recordScope(principal);
      const rows = listReviewInspections(db, {
        organisationId: query.organisationId ?? scope.organisationId ?? undefined,
        modelId: query.modelId,
        engineId: query.engineId,
      });
      const items = rows.map((row): ReviewQueueItem => {
        const inspection = findInspection(db, row.id)!;
        const left = leftToDo(inspection);
        const verdicts = left.recorded.flatMap((finding) =>
          finding.category ? [finding.category] : [],
        );
        return {
          inspection: toInspection(inspection),
          modelId: row.modelId,
          modelName: row.modelName,
          organisationName: row.organisationName,
          worstVerdict: verdicts.length ? verdicts.reduce(worse) : null,
          findingCount: left.recorded.length,
          left: {
            findings: left.findings.length,
            flags: inspection.state === 'submitted' ? left.flags.length : 0,
            coverageGaps: left.coverageGaps.length,
            outcome: inspection.state === 'submitted',
            release: true,
          },
        };
      });
      const rank = (item: ReviewQueueItem) =>
        item.worstVerdict === null ? -1 : severity(item.worstVerdict);
      return items
        .filter((item) => !query.verdict || item.worstVerdict === query.verdict)
        .sort(
          (a, b) =>
            rank(b) - rank(a) ||
            (a.inspection.submittedAt ?? '').localeCompare(b.inspection.submittedAt ?? '') ||
            a.inspection.date.localeCompare(b.inspection.date),
        );
    },

    /** The review of one inspection: dispositions, outcomes, releases, withdrawals, what is left. */
    review(principal: Principal, id: string): InspectionReview {
      const inspection = reviewableInspection(principal, id);
      if (recordScope(principal).releasedOnly) return this.released(inspection);
      const records = listDispositions(db, id);
      const outcomes = signaturesOf(db, 'outcome', id);
      const releases = signaturesOf(db, 'release', id);
      const withdrawals = signaturesOf(db, 'withdrawal', id);
      const signatures = new Map(
        findSignatures(
          db,
          records.map((record) => record.signatureId),
        ).map((record) => [record.id, record]),
      );
      const left = leftToDo(inspection);
      const dispositionsLeft = new Set(left.findings.map((item) => item.findingId));
      return {
        items: records.map((record) => toDisposition(record, signatures.get(record.signatureId)!)),
        outcomes: outcomes.map((signature) => {
          const content = signature.content as ReturnType<typeof outcomeContent>;
          const decisions = content.dispositions.map((item) => decisionSchema.parse(item.decision));
          return {
            kind: decisionOutcome(decisions).kind,
            repeatInterval: content.repeatInterval,
            removals: content.removals as BeyondAction[],
            flagAcceptances: content.flagAcceptances,
            current: signature.id === inspection.outcomeSignatureId,
            signature: toSignatureSummary(signature),
          };
        }),
        releases: releases.map((signature, index) => ({
          revision: index + 1,
          current: signature.id === inspection.releaseSignatureId,
          signature: toSignatureSummary(signature),
          verificationCode: findReport(db, inspection.id, index + 1)?.verificationCode ?? null,
        })),
        withdrawals: withdrawals.map((signature) => {
          const content = signature.content as ReturnType<typeof withdrawalContent>;
          return {
            reason: content.reason,
            dispositionIds: content.withdrawn.map((item) => item.dispositionId),
            signature: toSignatureSummary(signature),
          };
        }),
        recurrences: recurrences(
          inspection,
          left.recorded.filter((finding) => dispositionsLeft.has(finding.id)),
        ),
        left: {
          findings: left.findings,
          flags: inspection.state === 'submitted' ? left.flags : [],
          coverageGaps: left.coverageGaps,
        },
        signing: (() => {
          const reason = signingRefusal(principal, inspection);
          return { allowed: reason === null, reason };
        })(),
      };
    },

    /**
     * The review as the owner sees it: the decisions, outcome and release of the latest release,
     * exactly as released, whatever was corrected since (a correction reaches the owner with the
     * next release). Nothing of the review's own work shows.
     */
    released(inspection: InspectionRow): InspectionReview {
      const releases = signaturesOf(db, 'release', inspection.id);
      const latest = releases.at(-1);
      const outcomes = signaturesOf(db, 'outcome', inspection.id);
      const releasedOutcome = latest
        ? outcomes.find(
            (signature) =>
              signature.sha256 ===
              (latest.content as ReturnType<typeof releaseContent>).outcomeSignatureSha256,
          )
        : undefined;
      const releasedIds = new Set(
        (
          (releasedOutcome?.content as ReturnType<typeof outcomeContent> | undefined)
            ?.dispositions ?? []
        ).map((item) => item.dispositionId),
      );
      const records = listDispositions(db, inspection.id).filter((record) =>
        releasedIds.has(record.id),
      );
      const signatures = new Map(
        findSignatures(
          db,
          records.map((record) => record.signatureId),
        ).map((record) => [record.id, record]),
      );
      const content = releasedOutcome?.content as ReturnType<typeof outcomeContent> | undefined;
      return {
        items: records.map((record) => ({
          ...toDisposition(record, signatures.get(record.signatureId)!),
          state: 'current' as const,
          current: true,
        })),
        outcomes:
          releasedOutcome && content
            ? [
                {
                  kind: decisionOutcome(
                    content.dispositions.map((item) => decisionSchema.parse(item.decision)),
                  ).kind,
                  repeatInterval: content.repeatInterval,
                  removals: content.removals as BeyondAction[],
                  flagAcceptances: content.flagAcceptances,
                  current: true,
                  signature: toSignatureSummary(releasedOutcome),
                },
              ]
            : [],
        releases: latest
          ? [
              {
                revision: releases.length,
                current: true,
                signature: toSignatureSummary(latest),
                verificationCode:
                  findReport(db, inspection.id, releases.length)?.verificationCode ?? null,
              },
            ]
          : [],
        withdrawals: [],
        recurrences: [],
        left: { findings: [], flags: [], coverageGaps: [] },
        signing: { allowed: false, reason: 'Owners see released inspections; they do not sign.' },
      };
    },

    /**
     * An engineer's signed decision on one finding (DESIGN §5.5): separation of duties, authority,
     * concession reference and password checked before anything is written; the disposition, its
     * signature and its audit row written together.
     */
    async dispose(
      principal: Principal,
      findingId: string,
      input: ParsedDispositionInput,
      meta: RequestMeta,
    ): Promise<Disposition> {
      const finding = findFinding(db, findingId);
      if (!finding) throw AppError.notFound('There is no such finding');
      const inspection = reviewableInspection(principal, finding.inspectionId);
      if (inspection.state === 'draft')
        throw AppError.conflict(
          'This inspection is a draft: findings are dispositioned once it is submitted.',
        );
      if (finding.status !== 'recorded')
        throw AppError.conflict('This finding was voided: there is nothing to disposition.');
      const current = currentDisposition(db, finding.id);
      if (input.supersedesId) {
        const superseded = findDisposition(db, input.supersedesId);
        if (!superseded || superseded.findingId !== finding.id)
          throw AppError.unprocessable('The disposition to correct is not one of this finding.');
        if (superseded.state !== 'current')
          throw AppError.conflict(
            'That disposition is no longer current: correct the current one.',
          );
        if (!input.supersedeReason?.trim())
          throw AppError.unprocessable('Say why the earlier disposition is corrected.', {
            fields: { supersedeReason: ['Say why the earlier disposition is corrected'] },
            form: [],
          });
      } else if (current) {
        throw AppError.conflict(
          'This finding already has a current disposition: correct it, giving the reason, instead.',
        );
      } else if (inspection.state !== 'submitted') {
        throw AppError.conflict(
          'This inspection’s outcome is signed: correct a disposition instead.',
        );
      }
      if (changedFinding(db, finding.id, principal.user.id))
        throw AppError.forbidden(
          'You recorded or changed this finding: another engineer dispositions it.',
        );
      const signer = signerFor(principal, inspection);
      const verdict = verdictOf(finding);
      const concession = isConcession(input.decision, verdictForDecision(verdict));
      if (concession && !input.concessionRef)
        throw AppError.unprocessable(
          'This decision is looser than the verdict calls for: a concession needs the reference of whoever granted it.',
          {
            fields: {
              concessionRef: [
                'A concession needs its reference (the type certificate holder’s or the authority’s)',
              ],
            },
            form: [],
          },
        );
      if (input.recurrence) {
        const candidate = findFinding(db, input.recurrence.candidateFindingId);
        const candidateInspection = candidate && findInspection(db, candidate.inspectionId);
        if (!candidateInspection || candidateInspection.engineId !== inspection.engineId)
          throw AppError.unprocessable('The earlier finding named is not one of this engine.');
      }
      await checkPassword(ctx, principal, input.password, meta, 'signing needs it again');

      const id = newId();
      const now = ctx.now();
      const row = {
        id,
        findingId: finding.id,
        inspectionId: inspection.id,
        decision: input.decision as Record<string, unknown>,
        kind: input.decision.kind,
        rationale: input.rationale,
        concession,
        concessionRef: concession ? input.concessionRef : (input.concessionRef ?? null),
        supersedesId: input.supersedesId,
        supersedeReason: input.supersedesId ? input.supersedeReason : null,
        recurrence: input.recurrence,
        state: 'current' as const,
        signedBy: principal.user.id,
        signedAt: now,
      };
      inTransaction(db, (tx) => {
        // Checked again inside the write: two engineers signing the same finding at once.
        const stillCurrent = currentDisposition(tx, finding.id);
        if ((stillCurrent?.id ?? null) !== (input.supersedesId ?? null))
          throw AppError.conflict(
            'Someone dispositioned this finding a moment ago: reload to see it.',
          );
        const signature = appendSignature(ctx, tx, {
          kind: 'disposition',
          subjectId: id,
          signer,
          content: dispositionSubject(tx, finding, row),
        });
        if (input.supersedesId) endDispositions(tx, [input.supersedesId], 'superseded');
        insertDisposition(tx, { ...row, signatureId: signature.id });
        if (inspection.state !== 'submitted') {
          // A correction after the outcome needs a new outcome (and, after release, a new release).
          setInspectionState(tx, inspection.id, 'submitted', { outcomeSignatureId: null });
          refreshDue(
            ctx,
            tx,
            { engineId: inspection.engineId },
            `${principal.user.name} corrected finding F${finding.number} of the inspection of ${dayWords(inspection.date)}; its outcome is to be signed again.`,
          );
        }
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: input.supersedesId ? 'disposition.superseded' : 'disposition.signed',
          entityType: 'finding',
          entityId: finding.id,
          after: {
            dispositionId: id,
            decision: input.decision,
            concession,
            concessionRef: row.concessionRef,
            supersedesId: input.supersedesId,
            signatureSha256: signature.sha256,
          },
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
      const record = listDispositions(db, inspection.id).find((item) => item.id === id)!;
      return toDisposition(record, findSignatures(db, [record.signatureId])[0]!);
    },

    /** Signs the outcome once every finding, row and flag is settled (DESIGN §5.5). */
    async outcome(
      principal: Principal,
      id: string,
      input: ParsedOutcomeInput,
      meta: RequestMeta,
    ): Promise<InspectionReview> {
      const inspection = reviewableInspection(principal, id);
      if (inspection.state !== 'submitted')
        throw AppError.conflict(
          inspection.state === 'draft'
            ? 'This inspection is a draft: its outcome is signed once it is submitted and dispositioned.'
            : 'This inspection’s outcome is already signed.',
        );
      if (inspection.createdBy === principal.user.id)
        throw AppError.forbidden('You opened this inspection: another engineer signs its outcome.');
      const signer = signerFor(principal, inspection);
      const left = leftToDo(inspection);
      const notes = new Map(input.flagAcceptances.map((item) => [item.code, item.note]));
      const mine = new Set(flagsAcknowledgedBy(db, id, principal.user.id));
      const problems = [
        ...left.findings.map((item) => `F${item.number} has no current disposition.`),
        ...left.flags
          .filter((flag) => !notes.get(flag.code))
          .map((flag) => `Accept the flag "${flag.message}" with a note.`),
        ...left.coverageGaps.map((row) => `${row} was not fully viewed and no reason is recorded.`),
      ];
      if (problems.length)
        throw AppError.unprocessable(`The outcome cannot be signed yet: ${problems.join(' ')}`, {
          left: problems,
          fields: {},
          form: problems,
        });
      const own = left.flags.filter((flag) => mine.has(flag.code));
      if (own.length)
        throw AppError.forbidden(
          `You acknowledged ${own.map((flag) => `"${flag.message}"`).join(', ')} as the inspector: another engineer accepts it.`,
        );
      await checkPassword(ctx, principal, input.password, meta, 'signing needs it again');

      const now = ctx.now();
      inTransaction(db, (tx) => {
        const current = listDispositions(tx, id).filter((item) => item.state === 'current');
        if (
          current.length !== left.recorded.length ||
          findInspection(tx, id)!.state !== 'submitted'
        )
          throw AppError.conflict('The dispositions changed a moment ago: reload and sign again.');
        const signatures = new Map(
          findSignatures(
            tx,
            current.map((item) => item.signatureId),
          ).map((record) => [record.id, record]),
        );
        const decisions = current.map((item) => decisionSchema.parse(item.decision));
        const summary = decisionOutcome(decisions);
        const signature = appendSignature(ctx, tx, {
          kind: 'outcome',
          subjectId: id,
          signer,
          content: outcomeContent({
            inspectionId: id,
            dispositions: current.map((item, index) => ({
              findingId: item.findingId,
              dispositionId: item.id,
              signatureSha256: signatures.get(item.signatureId)!.sha256,
              decision: decisions[index]!,
            })),
            repeatInterval: summary.repeatInterval,
            removals: summary.removals,
            flagAcceptances: left.flags.map((flag) => ({
              code: flag.code,
              note: notes.get(flag.code)!,
            })),
          }),
        });
        setInspectionState(tx, id, 'dispositioned', { outcomeSignatureId: signature.id });
        alertRemovalOrdered(ctx, tx, inspection, principal.user.name, summary.removals);
        refreshDue(
          ctx,
          tx,
          { engineId: inspection.engineId },
          `${principal.user.name} signed the outcome of the inspection of ${dayWords(inspection.date)}.`,
        );
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'inspection.outcome-signed',
          entityType: 'inspection',
          entityId: id,
          before: { state: 'submitted' },
          after: {
            state: 'dispositioned',
            decision: summary.kind,
            repeatInterval: summary.repeatInterval,
            removals: summary.removals,
            signatureSha256: signature.sha256,
          },
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
      return this.review(principal, id);
    },

    /** Releases a dispositioned inspection to its owner: signed, and visible to the customer. */
    async release(
      principal: Principal,
      id: string,
      password: string,
      meta: RequestMeta,
    ): Promise<InspectionReview> {
      const inspection = reviewableInspection(principal, id);
      if (inspection.state !== 'dispositioned')
        throw AppError.conflict(
          inspection.state === 'released'
            ? 'This inspection is already released.'
            : 'Only an inspection whose outcome is signed can be released.',
        );
      const signer = signerFor(principal, inspection);
      await checkPassword(ctx, principal, password, meta, 'signing needs it again');
      // The report goes to the owner's report contacts: without one, nothing is released.
      const engine = findEngineRow(db, inspection.engineId)!;
      if (contactsFor(db, inspection.organisationId, 'reports').length === 0)
        throw AppError.unprocessable(
          `${engine.organisationName} has no contact for reports: add one under Admin → Organisations, then release. The signed report is e-mailed to them.`,
        );
      // The report is rendered first, outside the write: a report that cannot be made stops the
      // release as a whole. The release signature then covers the bytes' hash.
      const revision = inspection.releaseRevision + 1;
      const verificationCode = newVerificationCode();
      const due = planning.engineDue(principal, inspection.engineId);
      const pdf = await buildReport(ctx, {
        inspectionId: id,
        review: this.review(principal, id),
        revision,
        verificationCode,
        verifyUrl: verifyUrlOf(ctx, verificationCode),
        nextDue: [
          dueWords(due.nextInspection),
          due.removal
            ? `${removalKindWords[due.removal.kind]}${due.removal.dueDate ? `, due ${dueWords(due.removal)}` : ''}`
            : null,
        ]
          .filter(Boolean)
          .join('; '),
      });
      const pdfSha256 = createHash('sha256').update(pdf).digest('hex');
      const now = ctx.now();
      inTransaction(db, (tx) => {
        const fresh = findInspection(tx, id)!;
        if (
          fresh.state !== 'dispositioned' ||
          !fresh.outcomeSignatureId ||
          fresh.releaseRevision + 1 !== revision
        )
          throw AppError.conflict('The outcome changed a moment ago: reload and sign again.');
        const outcome = findSignatures(tx, [fresh.outcomeSignatureId])[0]!;
        const signature = appendSignature(ctx, tx, {
          kind: 'release',
          subjectId: id,
          signer,
          content: releaseContent({
            inspectionId: id,
            outcomeSignatureSha256: outcome.sha256,
            report: { pdfSha256, revision },
          }),
        });
        const reportId = newId();
        insertReport(tx, {
          id: reportId,
          inspectionId: id,
          revision,
          pdf,
          pdfSha256,
          verificationCode,
          releaseSignatureId: signature.id,
          createdAt: now,
        });
        // Mailed in the same transaction: the message exists exactly when the release does.
        queueMail(ctx, tx, {
          kind: 'report',
          ...reportEmail({
            to: contactsFor(tx, inspection.organisationId, 'reports').map((item) => item.email),
            engineSerialNumber: inspection.engineSerialNumber,
            inspectionDate: inspection.date,
            revision,
            link: `${publicOrigin(ctx.config.publicOrigins, ctx.config.port)}/inspections/${id}`,
            verifyUrl: verifyUrlOf(ctx, verificationCode),
            filename: reportFilename(inspection.engineSerialNumber, inspection.date, revision),
            pdf,
          }),
          // The report's own delivery log reads the messages about it.
          record: {
            type: 'report',
            id: reportId,
            label: `Report revision ${revision}, inspection of ${inspection.engineSerialNumber} on ${dayWords(inspection.date)}`,
          },
        });
        setInspectionState(tx, id, 'released', {
          releaseSignatureId: signature.id,
          releaseRevision: revision,
        });
        refreshDue(
          ctx,
          tx,
          { engineId: inspection.engineId },
          `${principal.user.name} released the inspection of ${dayWords(inspection.date)}.`,
        );
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'inspection.released',
          entityType: 'inspection',
          entityId: id,
          before: { state: 'dispositioned' },
          after: { state: 'released', revision, signatureSha256: signature.sha256 },
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
      return this.review(principal, id);
    },

    /**
     * Sends a submitted or dispositioned inspection back to the inspector, saying why. Signed
     * dispositions are withdrawn with a signed withdrawal (password asked), and stay visible.
     */
    async returnToDraft(
      principal: Principal,
      id: string,
      input: { reason: string; password?: string | undefined },
      meta: RequestMeta,
    ): Promise<void> {
      const inspection = reviewableInspection(principal, id);
      if (inspection.state !== 'submitted' && inspection.state !== 'dispositioned')
        throw AppError.conflict(
          inspection.state === 'draft'
            ? 'This inspection is already a draft.'
            : 'A released inspection is corrected by superseding a disposition, not sent back.',
        );
      const current = listDispositions(db, id).filter((item) => item.state === 'current');
      let signer: Signer | null = null;
      if (current.length > 0) {
        if (!input.password)
          throw AppError.unprocessable(
            'Sending it back withdraws the signed dispositions: enter your password to sign the withdrawal.',
            { fields: { password: ['Enter your password to sign the withdrawal'] }, form: [] },
          );
        signer = signerFor(principal, inspection);
        await checkPassword(ctx, principal, input.password, meta, 'signing needs it again');
      }
      const now = ctx.now();
      inTransaction(db, (tx) => {
        const fresh = listDispositions(tx, id).filter((item) => item.state === 'current');
        if (fresh.length !== current.length)
          throw AppError.conflict('The dispositions changed a moment ago: reload and try again.');
        let withdrawalSha256: string | null = null;
        if (signer && fresh.length) {
          const signatures = new Map(
            findSignatures(
              tx,
              fresh.map((item) => item.signatureId),
            ).map((record) => [record.id, record]),
          );
          const signature = appendSignature(ctx, tx, {
            kind: 'withdrawal',
            subjectId: id,
            signer,
            content: withdrawalContent({
              inspectionId: id,
              reason: input.reason,
              withdrawn: fresh.map((item) => ({
                dispositionId: item.id,
                signatureSha256: signatures.get(item.signatureId)!.sha256,
              })),
            }),
          });
          withdrawalSha256 = signature.sha256;
          endDispositions(
            tx,
            fresh.map((item) => item.id),
            'withdrawn',
          );
        }
        setInspectionState(tx, id, 'draft', {
          returnedReason: input.reason,
          returnedBy: principal.user.id,
          returnedAt: now,
          outcomeSignatureId: null,
        });
        refreshDue(
          ctx,
          tx,
          { engineId: inspection.engineId },
          `${principal.user.name} returned the inspection of ${dayWords(inspection.date)} to the inspector: ${input.reason}`,
        );
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'inspection.returned-to-draft',
          entityType: 'inspection',
          entityId: id,
          before: { state: inspection.state },
          after: {
            state: 'draft',
            reason: input.reason,
            withdrawnDispositions: fresh.length,
            withdrawalSha256,
          },
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
    },
  };
}

export type ReviewService = ReturnType<typeof createReviewService>;
