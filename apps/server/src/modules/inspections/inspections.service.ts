import { offsetOf, type Page } from '@emberline/contracts/paging';
import type {
  Inspection,
  InspectionDefaults,
  InspectionDetail,
  InspectionFlag,
  ParsedInspectionInput,
  InspectionListQuery,
  ParsedInspectionParticulars,
} from '@emberline/contracts/inspections';
import { inspectionFlags } from '@emberline/domain/inspection-flags';
import type { AppContext, RequestMeta } from '../../context';
import { inTransaction } from '../../db/client';
import { AppError } from '../../http/app-error';
import { recordScope } from '../../http/record-access';
import type { Principal } from '../../http/principal';
import { newId } from '../../lib/ids';
import { appendAudit } from '../audit/audit.repository';
import { listModelRows } from '../engine-models/engine-models.repository';
import { createEnginesService } from '../engines/engines.service';
import { listFindings, updateFinding } from '../findings/findings.repository';
import { findUserById } from '../users/users.repository';
import { listImages } from '../images/images.repository';
import { publishedLimitSet } from '../limit-sets/limit-sets.repository';
import { toImage } from '../images/image-view';
import { alertBeyondLimits } from '../review/review-alerts';
import { listUtilization } from '../utilization/utilization.repository';
import { draftInspection, visibleInspection } from './inspection-access';
import {
  findInspection,
  insertInspection,
  lastInspectionBy,
  listInspections,
  setInspectionState,
  updateInspectionFlags,
  updateInspectionParticulars,
  type InspectionRow,
} from './inspections.repository';

export function toInspection(row: InspectionRow): Inspection {
  return {
    id: row.id,
    engineId: row.engineId,
    engineSerialNumber: row.engineSerialNumber,
    organisationId: row.organisationId,
    date: row.date,
    reason: row.reason,
    reasonDetail: row.reasonDetail,
    csn: row.csn,
    tsn: row.tsn,
    inspectorName: row.inspectorName,
    qualificationRef: row.qualificationRef,
    qualificationExpiresOn: row.qualificationExpiresOn,
    probe: row.probe,
    probeCalibrationDueOn: row.probeCalibrationDueOn,
    rows: row.rows,
    state: row.state,
    flags: row.flags as InspectionFlag[],
    imageCount: row.imageCount,
    returnedReason: row.returnedReason,
    returnedByName: row.returnedReason ? row.returnedByName : null,
    returnedAt: row.returnedReason && row.returnedAt ? row.returnedAt.toISOString() : null,
    submittedAt: row.submittedAt?.toISOString() ?? null,
    voidReason: row.voidReason,
    voidedByName: row.voidReason ? row.voidedByName : null,
    voidedAt: row.voidedAt?.toISOString() ?? null,
    releaseRevision: row.releaseRevision,
    newerRevisionInForce:
      row.state !== 'draft' &&
      row.limitSetId !== null &&
      row.inForceLimitSetId !== null &&
      row.limitSetId !== row.inForceLimitSetId,
    createdAt: row.createdAt.toISOString(),
  };
}

/**
 * An inspection as its owner sees it: released, as of its latest release, even while a correction
 * made after that release waits for the next one; the review's own marks stay with the staff.
 */
function asReleased(inspection: Inspection): Inspection {
  return {
    ...inspection,
    state: 'released',
    newerRevisionInForce: false,
    returnedReason: null,
    returnedByName: null,
    returnedAt: null,
  };
}

export function createInspectionsService(ctx: AppContext) {
  const { db } = ctx;
  const engines = createEnginesService(ctx);
  const seen = (principal: Principal) =>
    recordScope(principal).releasedOnly ? asReleased : (inspection: Inspection) => inspection;

  return {
    list(principal: Principal, query: InspectionListQuery): Page<Inspection> {
      const { engineId, page, pageSize } = query;
      if (engineId) engines.visibleEngine(principal, engineId);
      const scope = recordScope(principal);
      const { rows, total } = listInspections(
        db,
        {
          engineId,
          organisationId: scope.organisationId ?? undefined,
          releasedOnly: scope.releasedOnly,
        },
        { limit: pageSize, offset: offsetOf(query) },
      );
      return { items: rows.map(toInspection).map(seen(principal)), total, page, pageSize };
    },

    /** Every inspection of one engine, newest first (a few a year over an engine's life). */
    ofEngine(principal: Principal, engineId: string): Inspection[] {
      engines.visibleEngine(principal, engineId);
      const scope = recordScope(principal);
      return listInspections(
        db,
        {
          engineId,
          organisationId: scope.organisationId ?? undefined,
          releasedOnly: scope.releasedOnly,
        },
        { limit: -1, offset: 0 },
      )
        .rows.map(toInspection)
        .map(seen(principal));
    },

    detail(principal: Principal, id: string): InspectionDetail {
      const inspection = visibleInspection(db, principal, id);
      return {
        ...seen(principal)(toInspection(inspection)),
        images: listImages(db, id).map(toImage),
      };
    },

    create(
      principal: Principal,
      input: ParsedInspectionInput,
      meta: RequestMeta,
    ): InspectionDetail {
      const engine = engines.visibleEngine(principal, input.engineId);
      const rowKeys = new Set(listModelRows(db, engine.modelId).map((row) => row.key));
      const unknown = input.rows.filter((key) => !rowKeys.has(key));
      if (unknown.length)
        throw AppError.unprocessable(`The engine model has no row ${unknown.join(', ')}`, {
          fields: { rows: [`Unknown row ${unknown[0]}`] },
          form: [],
        });
      if (input.date > ctx.now().toISOString().slice(0, 10)) {
        throw AppError.unprocessable('An inspection cannot be dated in the future', {
          fields: { date: ['Give the day the engine was inspected'] },
          form: [],
        });
      }
      const flags = inspectionFlags(input, engine, listUtilization(db, engine.id)).map((flag) => ({
        ...flag,
        acknowledgedAt: null,
        acknowledgedBy: null,
        note: null,
      }));
      const id = newId();
      const now = ctx.now();
      inTransaction(db, (tx) => {
        insertInspection(tx, {
          id,
          ...input,
          state: 'draft',
          flags,
          createdBy: principal.user.id,
          createdAt: now,
        });
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'inspection.created',
          entityType: 'inspection',
          entityId: id,
          after: { ...input, flags: flags.map((flag) => flag.code) },
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
      return this.detail(principal, id);
    },

    /** Records that a flag was seen and why the inspection may go on; submission needs every flag acknowledged. */
    acknowledge(
      principal: Principal,
      id: string,
      code: string,
      note: string,
      meta: RequestMeta,
    ): InspectionDetail {
      const inspection = draftInspection(db, principal, id);
      const flag = inspection.flags.find((item) => item.code === code);
      if (!flag) throw AppError.notFound('This inspection has no such flag');
      if (flag.acknowledgedAt) throw AppError.conflict('This flag is already acknowledged');
      const now = ctx.now();
      const flags = inspection.flags.map((item) =>
        item.code === code
          ? {
              ...item,
              acknowledgedAt: now.toISOString(),
              acknowledgedBy: principal.user.name,
              note,
            }
          : item,
      );
      inTransaction(db, (tx) => {
        updateInspectionFlags(tx, id, flags);
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'inspection.flag-acknowledged',
          entityType: 'inspection',
          entityId: id,
          after: { code, note },
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
      return this.detail(principal, findInspection(db, id)!.id);
    },

    /**
     * What a new inspection starts from for this inspector: the qualification on their record
     * (else the one of their last inspection) and the probe of their last inspection.
     */
    defaults(principal: Principal): InspectionDefaults {
      const record = findUserById(db, principal.user.id)?.qualification ?? null;
      const last = lastInspectionBy(db, principal.user.id);
      const qualification =
        record ??
        (last ? { ref: last.qualificationRef, expiresOn: last.qualificationExpiresOn } : null);
      return {
        qualificationRef: qualification?.ref ?? '',
        qualificationExpiresOn: qualification?.expiresOn ?? '',
        qualificationFrom: record ? 'record' : last ? 'last-inspection' : null,
        probe: last?.probe ?? '',
        probeCalibrationDueOn: last?.probeCalibrationDueOn ?? '',
        probeFrom: last?.date ?? null,
      };
    },

    /**
     * Corrects the particulars of a draft. The flags are computed again from the corrected
     * figures, and every acknowledgement is reset: what was accepted was about the old figures.
     */
    correct(
      principal: Principal,
      id: string,
      input: ParsedInspectionParticulars,
      meta: RequestMeta,
    ): InspectionDetail {
      const inspection = draftInspection(db, principal, id);
      const engine = engines.visibleEngine(principal, inspection.engineId);
      if (input.date > ctx.now().toISOString().slice(0, 10)) {
        throw AppError.unprocessable('An inspection cannot be dated in the future', {
          fields: { date: ['Give the day the engine was inspected'] },
          form: [],
        });
      }
      const flags = inspectionFlags(input, engine, listUtilization(db, engine.id)).map((flag) => ({
        ...flag,
        acknowledgedAt: null,
        acknowledgedBy: null,
        note: null,
      }));
      const fields = Object.keys(input) as (keyof ParsedInspectionParticulars)[];
      const changed = fields.filter((field) => inspection[field] !== input[field]);
      if (changed.length === 0) return this.detail(principal, id);
      const now = ctx.now();
      inTransaction(db, (tx) => {
        updateInspectionParticulars(tx, id, { ...input, flags });
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'inspection.corrected',
          entityType: 'inspection',
          entityId: id,
          before: {
            ...Object.fromEntries(changed.map((field) => [field, inspection[field]])),
            flags: inspection.flags.map((flag) => flag.code),
          },
          after: {
            ...Object.fromEntries(changed.map((field) => [field, input[field]])),
            flags: flags.map((flag) => flag.code),
          },
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
      return this.detail(principal, id);
    },

    /**
     * Voids a draft started by mistake, with the reason: it is kept (never deleted), its recorded
     * findings are voided with it, and it counts for nothing in due dates, trends or the impact
     * of a limit revision.
     */
    void(principal: Principal, id: string, reason: string, meta: RequestMeta): InspectionDetail {
      const inspection = draftInspection(db, principal, id);
      const now = ctx.now();
      inTransaction(db, (tx) => {
        const recorded = listFindings(tx, id).filter((finding) => finding.status === 'recorded');
        for (const finding of recorded)
          updateFinding(tx, finding.id, {
            status: 'void',
            voidReason: `The inspection was voided: ${reason}`,
            voidedAt: now,
            voidedBy: principal.user.id,
            evaluation: null,
            category: null,
            updatedAt: now,
          });
        setInspectionState(tx, id, 'void', {
          voidReason: reason,
          voidedBy: principal.user.id,
          voidedAt: now,
        });
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'inspection.voided',
          entityType: 'inspection',
          entityId: id,
          before: { state: inspection.state },
          after: { state: 'void', reason, findingsVoided: recorded.length },
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
      return this.detail(principal, id);
    },

    /** Sends a draft for review; every flag must be acknowledged first. Its images lock. */
    submit(principal: Principal, id: string, meta: RequestMeta): InspectionDetail {
      const inspection = draftInspection(db, principal, id);
      const open = inspection.flags.filter((flag) => !flag.acknowledgedAt);
      if (open.length > 0) {
        throw AppError.conflict(
          `Acknowledge ${open.length === 1 ? 'the flag' : `the ${open.length} flags`} before submitting: ${open.map((flag) => flag.message).join(' ')}`,
          {
            flags: open.map((flag) => flag.code),
          },
        );
      }
      if (inspection.imageCount === 0)
        throw AppError.unprocessable(
          'An inspection goes for review with its images: upload at least one first.',
        );
      const now = ctx.now();
      const engine = engines.visibleEngine(principal, inspection.engineId);
      // From submission on, the inspection keeps the revision it was judged against.
      const judgedAgainst =
        listFindings(db, id).find((finding) => finding.status === 'recorded' && finding.limitSetId)
          ?.limitSetId ??
        publishedLimitSet(db, engine.modelId)?.id ??
        null;
      inTransaction(db, (tx) => {
        setInspectionState(tx, id, 'submitted', {
          submittedAt: now,
          limitSetId: judgedAgainst,
          returnedReason: null,
          returnedBy: null,
          returnedAt: null,
        });
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'inspection.submitted',
          entityType: 'inspection',
          entityId: id,
          before: { state: 'draft' },
          after: { state: 'submitted', limitSetId: judgedAgainst },
          requestId: meta.requestId,
          ip: meta.ip,
        });
        alertBeyondLimits(ctx, tx, findInspection(tx, id)!, principal.user.name);
      });
      return this.detail(principal, id);
    },
  };
}
