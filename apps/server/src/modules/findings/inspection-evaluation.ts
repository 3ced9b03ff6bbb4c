import type { InspectionOutcome, RowCoverage } from '@emberline/contracts/findings';
import type { EvaluationFinding, FindingEvaluation } from '@emberline/contracts/limits';
import { inspectionCategory } from '@emberline/domain/coverage';
import { engineVerdict, evaluate } from '@emberline/domain/limits';
import type { DbOrTx } from '../../db/client';
import { listModelRows } from '../engine-models/engine-models.repository';
import { findEngineRow } from '../engines/engines.repository';
import { findInspection } from '../inspections/inspections.repository';
import { findLimitSet, listRules, publishedLimitSet } from '../limit-sets/limit-sets.repository';
import { listFindings, storeEvaluation, type FindingRecord } from './findings.repository';

/** What the evaluation reads of a stored finding: where it is and what was measured. */
export type EvaluationSource = Pick<
  FindingRecord,
  | 'rowKey'
  | 'position'
  | 'zone'
  | 'damage'
  | 'lengthMm'
  | 'widthMm'
  | 'depthMm'
  | 'areaMm2'
  | 'count'
  | 'uncertaintyMm'
  | 'uncertaintyMm2'
>;

export function toEvaluationFinding(finding: EvaluationSource, id: string): EvaluationFinding {
  return {
    id,
    row: finding.rowKey,
    position: finding.position,
    zone: finding.zone,
    damage: finding.damage as EvaluationFinding['damage'],
    lengthMm: finding.lengthMm,
    widthMm: finding.widthMm,
    depthMm: finding.depthMm,
    areaMm2: finding.areaMm2,
    count: finding.count,
    uncertaintyMm: finding.uncertaintyMm,
    uncertaintyMm2: finding.uncertaintyMm2,
  };
}

/**
 * Re-evaluates every recorded finding of an inspection against the revision in force for its
 * engine's model (or `limitSetId`, when a new revision is being put in force) and stores each
 * verdict with the revision used. A finding's verdict depends on its neighbours (count and
 * adjacency limits), so the whole inspection is judged at once, inside the caller's transaction.
 */
export function evaluateInspection(
  tx: DbOrTx,
  inspectionId: string,
  now: Date,
  limitSetId?: string,
): void {
  const inspection = findInspection(tx, inspectionId)!;
  const engine = findEngineRow(tx, inspection.engineId)!;
  const rows = listModelRows(tx, engine.modelId);
  const limitSet = limitSetId
    ? findLimitSet(tx, limitSetId)
    : publishedLimitSet(tx, engine.modelId);
  const rules = limitSet ? listRules(tx, limitSet.id) : [];
  const recorded = listFindings(tx, inspectionId).filter(
    (finding) => finding.status === 'recorded',
  );
  // Stored findings: their ids are primary keys, so not checked for repeats again.
  const result = evaluate(
    {
      rows: Object.fromEntries(rows.map((row) => [row.key, { count: row.count }])),
      rules,
      findings: recorded.map((finding) => toEvaluationFinding(finding, finding.id)),
    },
    { idsUnique: true },
  );
  result.findings.forEach((evaluation, index) => {
    storeEvaluation(tx, recorded[index]!.id, {
      evaluation,
      category: evaluation.category,
      limitSetId: limitSet?.id ?? null,
      evaluatedAt: now,
    });
  });
}

/**
 * The inspection outcome from the stored verdicts and the coverage: worst verdict (at best review
 * while a listed row is a gap), counts, strictest repeat interval and the removal actions.
 */
export function inspectionOutcome(
  db: DbOrTx,
  inspectionId: string,
  coverage: readonly RowCoverage[],
): InspectionOutcome {
  const recorded = listFindings(db, inspectionId).filter(
    (finding) => finding.status === 'recorded' && finding.evaluation,
  );
  const verdict = engineVerdict(
    recorded.map((finding) => finding.evaluation as unknown as FindingEvaluation),
  );
  const gaps = coverage.filter((row) => row.gap).map((row) => row.row);
  const inspection = findInspection(db, inspectionId)!;
  const usedId = recorded.find((finding) => finding.limitSetId)?.limitSetId;
  const limitSet = usedId
    ? findLimitSet(db, usedId)
    : publishedLimitSet(db, findEngineRow(db, inspection.engineId)!.modelId);
  return {
    category: inspectionCategory(verdict, gaps.length),
    findingsCategory: verdict.category,
    counts: verdict.counts,
    repeatInterval: verdict.repeatInterval,
    beyondActions: verdict.beyondActions,
    coverageGaps: gaps,
    limitSet: limitSet
      ? {
          id: limitSet.id,
          revision: limitSet.revision,
          title: limitSet.title,
          invented: limitSet.invented,
        }
      : null,
  };
}
