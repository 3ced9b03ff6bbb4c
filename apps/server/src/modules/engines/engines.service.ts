import { engineFieldWords } from '@emberline/contracts/fleet';
import { dayWords } from '@emberline/domain/dates';
import type {
  Engine,
  EngineDetail,
  ParsedEngineInput,
  EngineListQuery,
  EngineListResponse,
  ParsedEngineUpdate,
} from '@emberline/contracts/fleet';
import { dailyUtilization } from '@emberline/domain/utilization';
import type { AppContext, RequestMeta } from '../../context';
import { inTransaction } from '../../db/client';
import { AppError } from '../../http/app-error';
import { recordScope, seesOrganisationRecord } from '../../http/record-access';
import type { Principal } from '../../http/principal';
import { newId } from '../../lib/ids';
import { refreshDue } from '../planning/due-basis';
import { appendAudit } from '../audit/audit.repository';
import { findEngineModel } from '../engine-models/engine-models.repository';
import { findOrganisation } from '../organisations/organisations.repository';
import { listUtilization } from '../utilization/utilization.repository';
import {
  findEngineBySerial,
  findEngineRow,
  insertEngine,
  listEngines,
  updateEngine,
  type EngineListRow,
} from './engines.repository';

/** An engine as the caller sees it: customers see released inspections only, so nothing waits. */
export function toEngine(row: EngineListRow, principal: Principal): Engine {
  const { awaitingInspectionId, awaitingBeyondLimits, ...engine } = row;
  return {
    ...engine,
    preFleetInspection: row.preFleetInspection ?? null,
    shopRelease: row.shopRelease ?? null,
    nextDue: null,
    createdAt: row.createdAt.toISOString(),
    awaitingDisposition:
      awaitingInspectionId && !recordScope(principal).releasedOnly
        ? { inspectionId: awaitingInspectionId, beyondLimits: Boolean(awaitingBeyondLimits) }
        : null,
  };
}

/**
 * An engine returns to service with its shop's release (date, CSN, TSN), and only then: the
 * release closes every open requirement and is the new baseline (DESIGN §5.6).
 */
function assertShopRelease(before: EngineListRow, input: ParsedEngineUpdate, today: string): void {
  const refuse = (message: string) =>
    AppError.unprocessable(message, { fields: { shopRelease: [message] }, form: [] });
  const returning =
    input.status === 'installed' && (before.status === 'in-shop' || before.status === 'removed');
  if (!input.shopRelease) {
    if (returning)
      throw refuse(
        "Give the shop's release (date, CSN and TSN) to return the engine to service: it is the new baseline of its inspections.",
      );
    return;
  }
  if (!returning)
    throw refuse(
      'A shop release is entered with the change of status that returns an engine from the shop to service.',
    );
  const release = input.shopRelease;
  if (release.date > today) throw refuse('The shop release is a date up to today.');
  if (release.csn < before.csn && release.date >= before.tsnCsnAsOf)
    throw refuse(
      `The release CSN (${release.csn}) is below the engine's CSN of ${before.csn} on ${dayWords(before.tsnCsnAsOf)}: cycles never go backwards.`,
    );
}

export function createEnginesService(ctx: AppContext) {
  const { db } = ctx;

  /** The engine, when the caller may see it; 404 otherwise, never the record. */
  function visibleEngine(principal: Principal, id: string): EngineListRow {
    const row = findEngineRow(db, id);
    if (!row || !seesOrganisationRecord(principal, row))
      throw AppError.notFound('There is no such engine');
    return row;
  }

  function assertOwner(organisationId: string) {
    const owner = findOrganisation(db, organisationId);
    if (!owner || owner.kind !== 'customer') {
      throw AppError.unprocessable('The owner must be one of the customer organisations', {
        fields: { organisationId: ['Choose a customer organisation'] },
        form: [],
      });
    }
  }

  function audit(
    principal: Principal,
    meta: RequestMeta,
    action: string,
    id: string,
    before: unknown,
    after: unknown,
  ) {
    return {
      actorUserId: principal.user.id,
      action,
      entityType: 'engine',
      entityId: id,
      before,
      after,
      requestId: meta.requestId,
      ip: meta.ip,
    };
  }

  return {
    visibleEngine,

    list(principal: Principal, query: EngineListQuery): EngineListResponse {
      const { page, pageSize, sort: _sort, order: _order, dueState: _due, ...filters } = query;
      const { rows, total } = listEngines(db, query, {
        ...filters,
        scopeOrganisationId: recordScope(principal).organisationId ?? undefined,
      });
      return { items: rows.map((row) => toEngine(row, principal)), total, page, pageSize };
    },

    detail(principal: Principal, id: string): EngineDetail {
      const row = visibleEngine(principal, id);
      return {
        ...toEngine(row, principal),
        utilization: dailyUtilization(listUtilization(db, id)),
      };
    },

    create(principal: Principal, input: ParsedEngineInput, meta: RequestMeta): EngineDetail {
      if (!findEngineModel(db, input.modelId)) {
        throw AppError.unprocessable('That engine model does not exist', {
          fields: { modelId: ['Choose an engine model'] },
          form: [],
        });
      }
      assertOwner(input.organisationId);
      if (input.tsnCsnAsOf > ctx.now().toISOString().slice(0, 10)) {
        throw AppError.unprocessable('TSN and CSN cannot be given as of a future date', {
          fields: { tsnCsnAsOf: ['Give a date up to today'] },
          form: [],
        });
      }
      const id = newId();
      const now = ctx.now();
      inTransaction(db, (tx) => {
        if (findEngineBySerial(tx, input.modelId, input.serialNumber)) {
          throw AppError.conflict(
            `There is already an engine ${input.serialNumber} of this model`,
            { fields: { serialNumber: ['This serial number is already in the fleet'] }, form: [] },
          );
        }
        insertEngine(tx, { id, ...input, createdAt: now });
        appendAudit(tx, now, audit(principal, meta, 'engine.created', id, null, input));
      });
      return this.detail(principal, id);
    },

    update(
      principal: Principal,
      id: string,
      input: ParsedEngineUpdate,
      meta: RequestMeta,
    ): EngineDetail {
      const before = visibleEngine(principal, id);
      if (input.organisationId) assertOwner(input.organisationId);
      assertShopRelease(before, input, ctx.now().toISOString().slice(0, 10));
      const now = ctx.now();
      inTransaction(db, (tx) => {
        if (
          input.serialNumber &&
          input.serialNumber !== before.serialNumber &&
          findEngineBySerial(tx, before.modelId, input.serialNumber)
        ) {
          throw AppError.conflict(
            `There is already an engine ${input.serialNumber} of this model`,
            { fields: { serialNumber: ['This serial number is already in the fleet'] }, form: [] },
          );
        }
        updateEngine(tx, id, input);
        refreshDue(
          ctx,
          tx,
          { engineId: id },
          `${principal.user.name} changed the engine record (${Object.keys(input)
            .map((key) => engineFieldWords[key as keyof ParsedEngineUpdate] ?? key)
            .join(', ')}).`,
        );
        const picked = Object.fromEntries(
          Object.keys(input).map((key) => [key, before[key as keyof EngineListRow]]),
        );
        appendAudit(tx, now, audit(principal, meta, 'engine.updated', id, picked, input));
      });
      return this.detail(principal, id);
    },
  };
}
