import { offsetOf, type Page, type PageQuery } from '@emberline/contracts/paging';
import type {
  EngineModel,
  ParsedEngineModelInput,
  EngineModelRow,
  EngineModelSummary,
} from '@emberline/contracts/fleet';
import { rowChangeProblems } from '@emberline/domain/engine-model';
import type { AppContext, RequestMeta } from '../../context';
import { inTransaction } from '../../db/client';
import { AppError } from '../../http/app-error';
import { recordScope } from '../../http/record-access';
import type { Principal } from '../../http/principal';
import { newId } from '../../lib/ids';
import { refreshDue } from '../planning/due-basis';
import { appendAudit } from '../audit/audit.repository';
import {
  countEnginesOfModel,
  findEngineModel,
  insertEngineModel,
  latestVersion,
  countEngineModels,
  listEngineModels,
  listModelRows,
  replaceModelRows,
  rowKeysInUse,
  updateEngineModel,
} from './engine-models.repository';

export function createEngineModelsService(ctx: AppContext) {
  const { db } = ctx;

  function mustFind(id: string) {
    const model = findEngineModel(db, id);
    if (!model) throw AppError.notFound('There is no such engine model');
    return model;
  }

  /** A model; its engine count is of the caller's organisation for a customer (all for staff). */
  function detail(id: string, principal?: Principal): EngineModel {
    const model = mustFind(id);
    const inUse = rowKeysInUse(db, id);
    return {
      id: model.id,
      name: model.name,
      version: model.version,
      notes: model.notes,
      standardInterval: model.standardInterval ?? null,
      rows: listModelRows(db, id).map((row) => ({ ...row, inUse: inUse.has(row.key) })),
      engineCount: countEnginesOfModel(
        db,
        id,
        principal ? recordScope(principal).organisationId : null,
      ),
      createdAt: model.createdAt.toISOString(),
    };
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
      entityType: 'engine-model',
      entityId: id,
      before,
      after,
      requestId: meta.requestId,
      ip: meta.ip,
    };
  }

  return {
    detail,

    list(principal: Principal, query: PageQuery): Page<EngineModelSummary> {
      const items = listEngineModels(db, recordScope(principal).organisationId, {
        limit: query.pageSize,
        offset: offsetOf(query),
      }).map(({ model, rowCount, engineCount }) => ({
        id: model.id,
        name: model.name,
        version: model.version,
        notes: model.notes,
        standardInterval: model.standardInterval ?? null,
        rowCount: rowCount ?? 0,
        engineCount: engineCount ?? 0,
        createdAt: model.createdAt.toISOString(),
      }));
      return { items, total: countEngineModels(db), ...query };
    },

    create(principal: Principal, input: ParsedEngineModelInput, meta: RequestMeta): EngineModel {
      const id = newId();
      const now = ctx.now();
      inTransaction(db, (tx) => {
        const version = latestVersion(tx, input.name) + 1;
        insertEngineModel(tx, {
          id,
          name: input.name,
          version,
          notes: input.notes,
          standardInterval: input.standardInterval,
          createdAt: now,
        });
        replaceModelRows(tx, id, input.rows);
        appendAudit(
          tx,
          now,
          audit(principal, meta, 'engine-model.created', id, null, { ...input, version }),
        );
      });
      return detail(id);
    },

    /** Replaces name, notes and rows; rows that findings refer to keep their count, numbering and zones. */
    update(
      principal: Principal,
      id: string,
      input: ParsedEngineModelInput,
      meta: RequestMeta,
    ): EngineModel {
      const before = detail(id);
      const problems = rowChangeProblems(before.rows, input.rows, rowKeysInUse(db, id));
      if (problems.length > 0) throw AppError.conflict(problems.join('; '), { problems });
      if (input.name !== before.name && latestVersion(db, input.name) > 0) {
        throw AppError.conflict(
          `There is already a model called ${input.name}: make a new version of it instead`,
          { fields: { name: ['That name is taken'] }, form: [] },
        );
      }
      const now = ctx.now();
      inTransaction(db, (tx) => {
        updateEngineModel(tx, id, {
          name: input.name,
          notes: input.notes,
          standardInterval: input.standardInterval,
        });
        replaceModelRows(tx, id, input.rows);
        refreshDue(
          ctx,
          tx,
          { modelId: id },
          `${principal.user.name} changed the engine model ${input.name} (its rows or standard interval).`,
        );
        const { rows, name, notes, standardInterval } = before;
        appendAudit(
          tx,
          now,
          audit(
            principal,
            meta,
            'engine-model.updated',
            id,
            { name, notes, standardInterval, rows },
            input,
          ),
        );
      });
      return detail(id);
    },

    /** A new version of a model with the same rows, for changes its rows in use cannot take. */
    newVersion(principal: Principal, id: string, meta: RequestMeta): EngineModel {
      const source = detail(id);
      const copy = newId();
      const now = ctx.now();
      inTransaction(db, (tx) => {
        const version = latestVersion(tx, source.name) + 1;
        insertEngineModel(tx, {
          id: copy,
          name: source.name,
          version,
          notes: source.notes,
          standardInterval: source.standardInterval,
          createdAt: now,
        });
        replaceModelRows(
          tx,
          copy,
          source.rows.map(({ inUse: _inUse, ...row }): EngineModelRow => row),
        );
        appendAudit(
          tx,
          now,
          audit(
            principal,
            meta,
            'engine-model.versioned',
            copy,
            { from: id, version: source.version },
            { version },
          ),
        );
      });
      return detail(copy);
    },
  };
}
