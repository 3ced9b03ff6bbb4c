import {
  impactListLimit,
  type ImpactChange,
  type LimitSetImpact,
} from '@emberline/contracts/limit-sets';
import type { EngineModelRow } from '@emberline/contracts/fleet';
import { categories, type Category, type Rule } from '@emberline/contracts/limits';
import { verdictChange } from '@emberline/domain/impact';
import { prepareRules, worse } from '@emberline/domain/limits';
import type { CurrentFinding, CurrentInspection } from '../findings/findings.repository';
import { toEvaluationFinding } from '../findings/inspection-evaluation';

const zeroCounts = () =>
  Object.fromEntries(categories.map((category) => [category, 0])) as Record<Category, number>;

const worseOrNull = (a: Category | null, b: Category | null) =>
  a === null ? b : b === null ? a : worse(a, b);

/** The key of a finding within the preview: its inspection and its number there. */
export const findingKey = (change: { inspectionId: string; number: number }) =>
  `${change.inspectionId}#${change.number}`;

/**
 * Judges the current findings against a draft's rules, inspection by inspection (a verdict
 * depends on its neighbours), and compares each verdict with the one stored: counts per category
 * before and after, the findings whose verdict or interval changes (relaxed first), and the
 * engines they are on. `findings` must come one inspection after another. The listed changes
 * carry no finding id or stored rule yet (`findingId` empty): the caller looks those up for the
 * few it lists rather than reading them for every finding.
 */
export function limitSetImpact(input: {
  limitSetId: string;
  modelRows: readonly EngineModelRow[];
  rules: readonly Rule[];
  inspections: ReadonlyMap<string, CurrentInspection>;
  revisions: ReadonlyMap<string, string>;
  findings: Iterable<CurrentFinding>;
}): LimitSetImpact {
  const rows = Object.fromEntries(input.modelRows.map((row) => [row.key, { count: row.count }]));
  const judgeAll = prepareRules(rows, input.rules);
  const before = zeroCounts();
  const after = zeroCounts();
  const changes: ImpactChange[] = [];
  const engines = new Map<string, LimitSetImpact['engines'][number]>();
  const judgedInspections = new Set<string>();
  let total = 0;

  const judge = (group: CurrentFinding[]) => {
    const inspectionId = group[0]!.inspectionId;
    if (judgedInspections.has(inspectionId))
      throw new Error(`the findings of ${inspectionId} did not come together`);
    judgedInspections.add(inspectionId);
    const inspection = input.inspections.get(inspectionId)!;
    const engine = engines.get(inspection.engineId) ?? {
      engineId: inspection.engineId,
      engineSerial: inspection.engineSerial,
      changedFindings: 0,
      before: null,
      after: null,
    };
    engines.set(inspection.engineId, engine);
    // Ids made here from each finding's place in its group: unique, so not checked again.
    const judged = judgeAll(
      group.map((finding, index) => toEvaluationFinding(finding, String(index))),
      { explain: false, idsUnique: true },
    );
    group.forEach((finding, index) => {
      const evaluation = judged[index]!;
      if (finding.category) before[finding.category] += 1;
      after[evaluation.category] += 1;
      engine.before = worseOrNull(engine.before, finding.category);
      engine.after = worseOrNull(engine.after, evaluation.category);
      const change = verdictChange(finding, evaluation);
      if (change === 'same') return;
      engine.changedFindings += 1;
      changes.push({
        findingId: '',
        number: finding.number,
        inspectionId,
        inspectionDate: inspection.date,
        released: inspection.released,
        engineId: inspection.engineId,
        engineSerial: inspection.engineSerial,
        row: finding.rowKey,
        position: finding.position,
        zone: finding.zone,
        damage: finding.damage,
        before: {
          category: finding.category,
          ruleId: null,
          repeatInterval: finding.repeatInterval,
          revision: finding.limitSetId ? (input.revisions.get(finding.limitSetId) ?? null) : null,
        },
        after: {
          category: evaluation.category,
          ruleId: evaluation.ruleId,
          repeatInterval: evaluation.repeatInterval,
        },
        relaxed: change === 'relaxed',
      });
    });
  };

  let group: CurrentFinding[] = [];
  for (const finding of input.findings) {
    total += 1;
    if (group.length > 0 && group[0]!.inspectionId !== finding.inspectionId) {
      judge(group);
      group = [];
    }
    group.push(finding);
  }
  if (group.length > 0) judge(group);

  changes.sort(
    (a, b) =>
      Number(b.relaxed) - Number(a.relaxed) ||
      a.engineSerial.localeCompare(b.engineSerial) ||
      a.inspectionDate.localeCompare(b.inspectionDate) ||
      a.number - b.number,
  );
  return {
    limitSetId: input.limitSetId,
    inspections: judgedInspections.size,
    findings: total,
    before,
    after,
    changedCount: changes.length,
    changes: changes.slice(0, impactListLimit),
    engines: [...engines.values()]
      .filter((engine) => engine.changedFindings > 0)
      .sort((a, b) => a.engineSerial.localeCompare(b.engineSerial)),
  };
}
