import type { LimitSet, LimitSetSummary } from '@emberline/contracts/limit-sets';
import type { AppContext } from '../../context';
import { AppError } from '../../http/app-error';
import { findEngineModel } from '../engine-models/engine-models.repository';
import { findLimitSet, listLimitSets, listRules, type LimitSetRow } from './limit-sets.repository';

export function toLimitSetSummary(row: LimitSetRow): LimitSetSummary {
  return {
    id: row.id,
    modelId: row.modelId,
    revision: row.revision,
    title: row.title,
    status: row.status,
    manualReference: row.manualReference,
    effectiveDate: row.effectiveDate,
    invented: row.invented,
    ruleCount: row.ruleCount,
    basedOnId: row.basedOnId,
    publishedAt: row.publishedAt?.toISOString() ?? null,
    publishedByName: row.publishedByName,
    contentSha256: row.contentSha256,
    createdAt: row.createdAt.toISOString(),
  };
}

/** The limit library, read side: staff only (the route policy keeps customers out). */
export function createLimitSetsService(ctx: AppContext) {
  const { db } = ctx;
  return {
    list(modelId: string): LimitSetSummary[] {
      if (!findEngineModel(db, modelId)) throw AppError.notFound('There is no such engine model');
      return listLimitSets(db, modelId).map(toLimitSetSummary);
    },

    detail(id: string): LimitSet {
      const row = findLimitSet(db, id);
      if (!row) throw AppError.notFound('There is no such limit-set revision');
      return { ...toLimitSetSummary(row), rules: listRules(db, id) };
    },
  };
}
