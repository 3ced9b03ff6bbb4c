import {
  impactListLimit,
  type ImpactChange,
  type LimitSetImpact,
} from '@emberline/contracts/limit-sets';
import type { EngineModelRow } from '@emberline/contracts/fleet';
import { categories, type Category, type Rule } from '@emberline/contracts/limits';
import { verdictChange } from '@emberline/domain/impact';
import { prepareRules, severity, worse } from '@emberline/domain/limits';
import type { CurrentFinding, CurrentInspection } from '../findings/findings.repository';

/** Counts by severity (0 serviceable … 3 beyond limits), as each category's count. */
const countsOf = (tally: readonly number[]) =>
  Object.fromEntries(
    categories.map((category) => [category, tally[severity(category)]!]),
  ) as Record<Category, number>;

const worseOrNull = (a: Category | null, b: Category | null) =>
  a === null ? b : b === null ? a : worse(a, b);

const bySeverity = [...categories].sort((a, b) => severity(a) - severity(b));

/** As `localeCompare`, with one collator made once: thousands of changes are sorted. */
const byText = new Intl.Collator();

/** The key of a finding within the preview: its inspection and its number there. */
export const findingKey = (change: { inspectionId: string; number: number }) =>
  `${change.inspectionId}#${change.number}`;

/**
 * Judges the current findings against a draft's rules, inspection by inspection (a verdict
 * depends on its neighbours), and compares each verdict with the one stored: counts per category
 * before and after, the findings whose verdict or interval changes (relaxed first), and the
 * engines they are on, an inspection at a time. The listed changes
 * carry no finding id or stored rule yet (`findingId` empty): the caller looks those up for the
 * few it lists rather than reading them for every finding.
 */
export function limitSetImpact(input: {
  limitSetId: string;
  modelRows: readonly EngineModelRow[];
  rules: readonly Rule[];
  revisions: ReadonlyMap<string, string>;
  current: Iterable<{ inspection: CurrentInspection; findings: CurrentFinding[] }>;
}): LimitSetImpact {
  const rows = Object.fromEntries(input.modelRows.map((row) => [row.key, { count: row.count }]));
  const judgeAll = prepareRules(rows, input.rules);
  const before = [0, 0, 0, 0];
  const after = [0, 0, 0, 0];
  const changes: ImpactChange[] = [];
  const engines = new Map<string, LimitSetImpact['engines'][number]>();
  let judgedInspections = 0;
  let total = 0;

  for (const { inspection, findings: group } of input.current) {
    const inspectionId = inspection.id;
    judgedInspections += 1;
    total += group.length;
    const engine = engines.get(inspection.engineId) ?? {
      engineId: inspection.engineId,
      engineSerial: inspection.engineSerial,
      changedFindings: 0,
      before: null,
      after: null,
    };
    engines.set(inspection.engineId, engine);
    // A current finding's id is its number, unique within its inspection: not checked again.
    const judged = judgeAll(group, { explain: false, idsUnique: true });
    let worstBefore = -1;
    let worstAfter = -1;
    for (let index = 0; index < group.length; index += 1) {
      const finding = group[index]!;
      const evaluation = judged[index]!;
      // Tallied by severity here, and the engine's worst taken once per inspection below.
      if (finding.category) {
        const level = severity(finding.category);
        before[level]! += 1;
        if (level > worstBefore) worstBefore = level;
      }
      const level = severity(evaluation.category);
      after[level]! += 1;
      if (level > worstAfter) worstAfter = level;
      const change = verdictChange(finding, evaluation);
      if (change === 'same') continue;
      engine.changedFindings += 1;
      changes.push({
        findingId: '',
        number: finding.number,
        inspectionId,
        inspectionDate: inspection.date,
        released: inspection.released,
        engineId: inspection.engineId,
        engineSerial: inspection.engineSerial,
        row: finding.row,
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
    }
    if (worstBefore >= 0) engine.before = worseOrNull(engine.before, bySeverity[worstBefore]!);
    engine.after = worseOrNull(engine.after, bySeverity[worstAfter]!);
  }

  changes.sort(
    (a, b) =>
      Number(b.relaxed) - Number(a.relaxed) ||
      byText.compare(a.engineSerial, b.engineSerial) ||
      byText.compare(a.inspectionDate, b.inspectionDate) ||
      a.number - b.number,
  );
  return {
    limitSetId: input.limitSetId,
    inspections: judgedInspections,
    findings: total,
    before: countsOf(before),
    after: countsOf(after),
    changedCount: changes.length,
    changes: changes.slice(0, impactListLimit),
    engines: [...engines.values()]
      .filter((engine) => engine.changedFindings > 0)
      .sort((a, b) => byText.compare(a.engineSerial, b.engineSerial)),
  };
}
