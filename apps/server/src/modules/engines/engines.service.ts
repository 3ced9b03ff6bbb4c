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
  const { awaitingInspectionId, awaitingBeyondLimits, shopRelease: _shopRelease, ...engine } = row;
  return {
    ...engine,
    preFleetInspection: row.preFleetInspection ?? null,
    nextDue: null,
    createdAt: row.createdAt.toISOString(),
    awaitingDisposition:
      awaitingInspectionId && !recordScope(principal).releasedOnly
        ? { inspectionId: awaitingInspectionId, beyondLimits: Boolean(awaitingBeyondLimits) }
        : null,
  };
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
      const { page, pageSize, sort: _sort, order: _order, ...filters } = query;
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
        const picked = Object.fromEntries(
          Object.keys(input).map((key) => [key, before[key as keyof EngineListRow]]),
        );
        appendAudit(tx, now, audit(principal, meta, 'engine.updated', id, picked, input));
      });
      return this.detail(principal, id);
    },
  };
}
