import {
  categories,
  type BeyondAction,
  type Category,
  type EngineVerdict,
  type EvaluationFinding,
  type EvaluationRequest,
  type EvaluationResult,
  type FindingEvaluation,
  type Interval,
  type Measure,
  type Reason,
  type Rule,
  type RuleJudgement,
} from '@emberline/contracts/limits';
import { DomainError } from './errors';
import { hasCountLimit, validateRules } from './rules';
import { atMost, exceeds, fromMillimetres } from './units';

const rank: Record<Category, number> = {
  serviceable: 0,
  'repeat-inspection': 1,
  review: 2,
  'beyond-limits': 3,
};

/** As `rank`, compared instead of looked up: this runs once per finding of an engine verdict. */
function severityOf(category: Category): number {
  if (category === 'serviceable') return 0;
  if (category === 'repeat-inspection') return 1;
  return category === 'review' ? 2 : 3;
}

/** A category's severity: 0 serviceable, 1 repeat inspection, 2 review, 3 beyond limits. */
export const severity = (category: Category): number => rank[category];

/** The worse of two categories (serviceable < repeat-inspection < review < beyond-limits). */
export function worse(a: Category, b: Category): Category {
  return rank[a] >= rank[b] ? a : b;
}

function refuseNegative(
  finding: EvaluationFinding,
  index: number,
  field: keyof EvaluationFinding,
  value: number | null,
): void {
  if (value !== null && value < 0)
    throw new DomainError(`finding ${finding.id} has a negative ${field} (${value})`, [
      'findings',
      index,
      field,
    ]);
}

/** Refuses a finding that does not fit its row, or with a negative measurement. */
function validateFinding(
  finding: EvaluationFinding,
  index: number,
  row: RowIndex | undefined,
): asserts row is RowIndex {
  if (row === undefined)
    throw new DomainError(
      `finding ${finding.id} is on the row "${finding.row}", which this engine model does not have`,
      ['findings', index, 'row'],
    );
  if (!(finding.position >= 1 && finding.position <= row.count)) {
    throw new DomainError(
      `finding ${finding.id} is at position ${finding.position}, outside ${finding.row} (positions 1 to ${row.count})`,
      ['findings', index, 'position'],
    );
  }
  refuseNegative(finding, index, 'lengthMm', finding.lengthMm);
  refuseNegative(finding, index, 'widthMm', finding.widthMm);
  refuseNegative(finding, index, 'depthMm', finding.depthMm);
  refuseNegative(finding, index, 'areaMm2', finding.areaMm2);
  refuseNegative(finding, index, 'count', finding.count);
  refuseNegative(finding, index, 'uncertaintyMm', finding.uncertaintyMm);
  refuseNegative(finding, index, 'uncertaintyMm2', finding.uncertaintyMm2);
}

/** Refuses findings sharing an id. */
function refuseRepeatedIds(findings: readonly EvaluationFinding[]): void {
  const seen = new Set<string>();
  for (let index = 0; index < findings.length; index += 1) {
    const id = findings[index]!.id;
    if (seen.has(id))
      throw new DomainError(`finding ${id} appears twice: every finding needs its own id`, [
        'findings',
        index,
        'id',
      ]);
    seen.add(id);
  }
}

function measuredValue(finding: EvaluationFinding, measure: Measure): number | null {
  switch (measure) {
    case 'length':
      return finding.lengthMm;
    case 'width':
      return finding.widthMm;
    case 'depth':
      return finding.depthMm;
    case 'area':
      return finding.areaMm2;
    case 'count':
      return finding.count;
  }
}

function uncertaintyOf(finding: EvaluationFinding, measure: Measure): number {
  if (measure === 'count') return 0;
  return (measure === 'area' ? finding.uncertaintyMm2 : finding.uncertaintyMm) ?? 0;
}

function band(rule: Rule, value: number): number {
  if (rule.serviceableMax !== null && atMost(value, rule.serviceableMax)) return 0;
  if (rule.repeatMax !== null && atMost(value, rule.repeatMax)) return 1;
  return 3;
}

const bandCategory: Category[] = ['serviceable', 'repeat-inspection', 'review', 'beyond-limits'];
const bandReason: Reason[] = [
  'within-serviceable',
  'within-repeat',
  'missing-measurement',
  'exceeds-limit',
];

// One frozen array per reason: judgements share them, so that judging a finding allocates little.
const single = Object.fromEntries(
  [...bandReason, 'not-permitted', 'count-rule-only', 'no-matching-rule'].map((reason) => [
    reason,
    Object.freeze([reason]),
  ]),
) as unknown as Record<Reason, Reason[]>;

/**
 * The working of one rule on one finding, as ranks; reused from finding to finding. Numbers only,
 * NaN where there is none, so that V8 keeps them in place instead of boxing each one anew.
 */
interface Working {
  level: number;
  measuredLevel: number;
  reasons: Reason[];
  value: number;
  uncertainty: number;
  utilisation: number;
}

const orNull = (value: number): number | null => (Number.isNaN(value) ? null : value);

function work(rule: Rule, finding: EvaluationFinding, into: Working): Working {
  const raw = measuredValue(finding, rule.measure);
  const value = raw === null ? null : fromMillimetres(raw, rule.unit);
  into.value = value ?? NaN;
  into.uncertainty =
    value === null ? NaN : fromMillimetres(uncertaintyOf(finding, rule.measure), rule.unit);
  into.utilisation = NaN;
  if (rule.notPermitted) {
    into.level = into.measuredLevel = 3;
    into.reasons = single['not-permitted'];
  } else if (rule.serviceableMax === null && rule.repeatMax === null) {
    into.level = into.measuredLevel = 0;
    into.reasons = single['count-rule-only'];
  } else if (value === null) {
    into.level = into.measuredLevel = 2;
    into.reasons = single['missing-measurement'];
  } else {
    into.measuredLevel = band(rule, value);
    into.level = band(rule, value + into.uncertainty);
    into.reasons = bandReasons[into.level]!;
    const outer = (rule.repeatMax ?? rule.serviceableMax)!;
    into.utilisation = outer === 0 ? NaN : value / outer;
  }
  return into;
}

function toJudgement(rule: Rule, working: Working): RuleJudgement {
  return {
    ruleId: rule.id,
    category: bandCategory[working.level]!,
    measuredCategory: bandCategory[working.measuredLevel]!,
    reasons: working.reasons,
    value: orNull(working.value),
    uncertainty: orNull(working.uncertainty),
    unit: rule.unit,
    utilisation: orNull(working.utilisation),
  };
}

const bandReasons = bandReason.map((reason) => single[reason]);

const blank = (): Working => ({
  level: 0,
  measuredLevel: 0,
  reasons: single['count-rule-only'],
  value: NaN,
  uncertainty: NaN,
  utilisation: NaN,
});

/** How one rule judges one finding, steps 1 to 6 of DESIGN §5.2. */
export function judge(rule: Rule, finding: EvaluationFinding): RuleJudgement {
  return toJudgement(rule, work(rule, finding, blank()));
}

function minimum(a: number | null, b: number | null): number | null {
  if (a === null) return b;
  if (b === null) return a;
  return Math.min(a, b);
}

/** Each of cycles, hours and days taken separately as the smallest given. */
export function strictestInterval(intervals: readonly (Interval | null)[]): Interval | null {
  let result: Interval | null = null;
  for (const interval of intervals) {
    if (!interval) continue;
    result = result
      ? {
          cycles: minimum(result.cycles, interval.cycles),
          hours: minimum(result.hours, interval.hours),
          days: minimum(result.days, interval.days),
        }
      : { ...interval };
  }
  return result;
}

const actionOrder: Record<BeyondAction['kind'], number> = {
  'remove-before-next-flight': 0,
  'remove-within': 1,
  'remove-at-next-shop-visit': 2,
};

/** Negative when a is more restrictive than b: before next flight, then within fewest cycles and hours, then next shop visit. */
export function compareActions(a: BeyondAction, b: BeyondAction): number {
  const byKind = actionOrder[a.kind] - actionOrder[b.kind];
  if (byKind !== 0 || a.kind !== 'remove-within') return byKind;
  const cycles = (a.cycles ?? Infinity) - (b.cycles ?? Infinity);
  if (cycles !== 0 && !Number.isNaN(cycles)) return cycles;
  const hours = (a.hours ?? Infinity) - (b.hours ?? Infinity);
  return Number.isNaN(hours) ? 0 : hours;
}

function strictestAction(a: BeyondAction | null, b: BeyondAction | null): BeyondAction | null {
  if (!a) return b;
  if (!b) return a;
  return compareActions(b, a) < 0 ? b : a;
}

/** A rule that matches a finding's row, damage and zone, and whether it also limits counts. */
interface Candidate {
  rule: Rule;
  counts: boolean;
}

/** A row's count of positions, and its rules by damage. */
interface RowIndex {
  count: number;
  byDamage: Map<string, ZoneIndex>;
}

/** The rules of one row and damage, and the lists of those matching each zone met so far. */
interface ZoneIndex {
  rules: Rule[];
  byZone: Map<string, Candidate[]>;
}

const noJudgements: RuleJudgement[] = Object.freeze([]) as unknown as RuleJudgement[];

function stricterInterval(a: Interval | null, b: Interval | null): Interval | null {
  // The rule's own interval object when it is the only one: rules are not changed once given.
  if (!a) return b;
  if (!b) return a;
  return {
    cycles: minimum(a.cycles, b.cycles),
    hours: minimum(a.hours, b.hours),
    days: minimum(a.days, b.days),
  };
}

const scratch = blank();

/**
 * Judges one finding by every candidate rule (those matching its row, damage and zone) and keeps, as it goes, the worst
 * category and, among the rules tied at it, the strictest interval or removal and the governing rule.
 */
function judgeFinding(
  finding: EvaluationFinding,
  candidates: readonly Candidate[],
  explain: boolean,
): FindingEvaluation {
  let worst = -1;
  let worstMeasured = 0;
  let ruleId: string | null = null;
  let reasons: Reason[] = [];
  let utilisation = NaN;
  let interval: Interval | null = null;
  let action: BeyondAction | null = null;
  const judgements = explain ? [] : noJudgements;
  for (let index = 0; index < candidates.length; index += 1) {
    const { rule } = candidates[index]!;
    const working = work(rule, finding, scratch);
    if (explain) judgements.push(toJudgement(rule, working));
    const level = working.level;
    if (working.measuredLevel > worstMeasured) worstMeasured = working.measuredLevel;
    if (level > worst) {
      worst = level;
      ruleId = rule.id;
      reasons = working.reasons;
      utilisation = working.utilisation;
      interval = level === 1 ? stricterInterval(null, rule.repeatInterval) : null;
      action = level === 3 ? rule.beyondAction : null;
    } else if (level === worst) {
      if (level === 1) interval = stricterInterval(interval, rule.repeatInterval);
      if (level === 3) action = strictestAction(action, rule.beyondAction);
      // The higher utilisation governs (none ranks below any number); on a tie, the rule listed first.
      if (
        !Number.isNaN(working.utilisation) &&
        (Number.isNaN(utilisation) || working.utilisation > utilisation)
      ) {
        ruleId = rule.id;
        reasons = working.reasons;
        utilisation = working.utilisation;
      }
    }
  }
  // No rule matches: review (DESIGN §5.2). One object literal for both outcomes, so that V8
  // allocates every result alike.
  const matched = worst !== -1;
  return {
    id: finding.id,
    category: matched ? bandCategory[worst]! : 'review',
    measuredCategory: matched ? bandCategory[worstMeasured]! : 'review',
    indeterminate: worst > worstMeasured,
    ruleId,
    reasons: matched ? reasons : single['no-matching-rule'],
    utilisation: orNull(utilisation),
    repeatInterval: interval,
    beyondAction: action,
    judgements,
  };
}

function escalate(
  evaluation: FindingEvaluation,
  finding: EvaluationFinding,
  rule: Rule,
  reason: Reason,
): void {
  if (evaluation.category !== 'beyond-limits') {
    evaluation.ruleId = rule.id;
    evaluation.utilisation = judge(rule, finding).utilisation;
    evaluation.reasons = [];
  }
  evaluation.category = 'beyond-limits';
  evaluation.measuredCategory = 'beyond-limits';
  evaluation.indeterminate = false;
  evaluation.repeatInterval = null;
  // Reasons arrays may be shared (frozen) between findings: replace, never push.
  if (!evaluation.reasons.includes(reason)) evaluation.reasons = [...evaluation.reasons, reason];
  evaluation.beyondAction = strictestAction(evaluation.beyondAction, rule.beyondAction);
}

/** Runs of consecutive positions around a ring of `count` positions (N is next to 1). */
export function circularRuns(positions: readonly number[], count: number): number[][] {
  const sorted = [...new Set(positions)].sort((a, b) => a - b);
  if (sorted.length === 0) return [];
  if (sorted.length === count) return [sorted];
  const runs: number[][] = [];
  for (const position of sorted) {
    const last = runs[runs.length - 1];
    if (last && position === last[last.length - 1]! + 1) last.push(position);
    else runs.push([position]);
  }
  const first = runs[0]!;
  const final = runs[runs.length - 1]!;
  if (runs.length > 1 && first[0] === 1 && final[final.length - 1] === count) {
    runs[0] = [...final, ...first];
    runs.pop();
  }
  return runs;
}

function applyCountRule(
  rule: Rule,
  matched: number[],
  findings: readonly EvaluationFinding[],
  evaluations: FindingEvaluation[],
  rowCount: number,
): void {
  const byPosition = new Map<number, number[]>();
  for (const index of matched) {
    const position = findings[index]!.position;
    const group = byPosition.get(position);
    if (group) group.push(index);
    else byPosition.set(position, [index]);
  }
  for (const group of byPosition.values()) {
    if (rule.maxPerAirfoil !== null && group.length > rule.maxPerAirfoil) {
      for (const index of group)
        escalate(evaluations[index]!, findings[index]!, rule, 'count-per-airfoil');
    }
    if (rule.maxTotalPerAirfoil !== null) {
      let total = 0;
      for (const index of group) {
        const raw = measuredValue(findings[index]!, rule.measure);
        if (raw !== null)
          total += fromMillimetres(raw + uncertaintyOf(findings[index]!, rule.measure), rule.unit);
      }
      if (exceeds(total, rule.maxTotalPerAirfoil))
        for (const index of group)
          escalate(evaluations[index]!, findings[index]!, rule, 'total-per-airfoil');
    }
  }
  if (rule.maxAirfoilsPerRow !== null && byPosition.size > rule.maxAirfoilsPerRow) {
    for (const index of matched)
      escalate(evaluations[index]!, findings[index]!, rule, 'airfoils-per-row');
  }
  if (rule.maxAdjacentAirfoils !== null) {
    for (const run of circularRuns([...byPosition.keys()], rowCount)) {
      if (run.length <= rule.maxAdjacentAirfoils) continue;
      for (const position of run)
        for (const index of byPosition.get(position)!)
          escalate(evaluations[index]!, findings[index]!, rule, 'adjacent-airfoils');
    }
  }
}

/** The engine verdict: the worst category, the counts, the strictest interval and every removal action. */
export function engineVerdict(evaluations: readonly FindingEvaluation[]): EngineVerdict {
  const tally = [0, 0, 0, 0];
  let worst = 0;
  let interval: Interval | null = null;
  // The removals as given by the rules (a few objects, shared by many findings), told apart by
  // what they say only at the end.
  const given = new Set<BeyondAction>();
  for (let index = 0; index < evaluations.length; index += 1) {
    const evaluation = evaluations[index]!;
    const level = severityOf(evaluation.category);
    tally[level]! += 1;
    if (level > worst) worst = level;
    if (level === 1) interval = stricterInterval(interval, evaluation.repeatInterval);
    else if (level === 3 && evaluation.beyondAction) given.add(evaluation.beyondAction);
  }
  const actions = new Map<string, BeyondAction>();
  for (const action of given)
    actions.set(`${action.kind}|${action.cycles}|${action.hours}`, action);
  const counts = Object.fromEntries(
    categories.map((category) => [category, tally[rank[category]]!]),
  ) as Record<Category, number>;
  return {
    category: bandCategory[worst]!,
    repeatInterval: interval ? { ...interval } : null,
    beyondActions: [...actions.values()].sort(compareActions),
    counts,
  };
}

/**
 * A rule set checked and indexed once, to judge many inspections with: the rules are validated
 * against the rows here, and each `judge` call validates only its findings. Every finding of one
 * inspection goes to one call, since count, row and adjacency limits look at its neighbours.
 */
export function prepareRules(
  rows: EvaluationRequest['rows'],
  rules: readonly Rule[],
): (
  findings: readonly EvaluationFinding[],
  options?: { explain?: boolean; idsUnique?: boolean },
) => FindingEvaluation[] {
  validateRules(rules, new Set(Object.keys(rows)));
  // Each row with its count and its rules by damage, in the order given; each finding then looks up
  // the list for its row, damage and zone, filtered once on first use.
  const byRow = new Map<string, RowIndex>(
    Object.entries(rows).map(([row, { count }]) => [row, { count, byDamage: new Map() }]),
  );
  for (const rule of rules) {
    const { byDamage } = byRow.get(rule.row)!;
    let index = byDamage.get(rule.damage);
    if (!index) byDamage.set(rule.damage, (index = { rules: [], byZone: new Map() }));
    index.rules.push(rule);
  }
  const none: Candidate[] = [];
  const candidatesFor = (row: RowIndex, finding: EvaluationFinding): Candidate[] => {
    const index = row.byDamage.get(finding.damage);
    if (!index) return none;
    let list = index.byZone.get(finding.zone);
    if (!list) {
      list = index.rules
        .filter((rule) => rule.zones.includes('*') || rule.zones.includes(finding.zone))
        .map((rule) => ({ rule, counts: hasCountLimit(rule) }));
      index.byZone.set(finding.zone, list);
    }
    return list;
  };

  return (findings, options = {}) => {
    const explain = options.explain ?? true;
    if (!options.idsUnique) refuseRepeatedIds(findings);
    const matchedByRule = new Map<Rule, number[]>();
    const evaluations: FindingEvaluation[] = new Array(findings.length);
    for (let current = 0; current < findings.length; current += 1) {
      const finding = findings[current]!;
      const row = byRow.get(finding.row);
      validateFinding(finding, current, row);
      const candidates = candidatesFor(row, finding);
      for (const candidate of candidates) {
        if (!candidate.counts) continue;
        const matched = matchedByRule.get(candidate.rule);
        if (matched) matched.push(current);
        else matchedByRule.set(candidate.rule, [current]);
      }
      evaluations[current] = judgeFinding(finding, candidates, explain);
    }
    for (const [rule, matched] of matchedByRule)
      applyCountRule(rule, matched, findings, evaluations, byRow.get(rule.row)!.count);
    return evaluations;
  };
}

/**
 * Evaluates every finding of an inspection against a rule set (DESIGN §5.2): each matching rule,
 * the worst governing, then the count, total, row and adjacency limits per row, then the engine
 * verdict. Throws a DomainError naming the item for inconsistent input. With `explain: false` the
 * per-rule working (`judgements`) is left out, for evaluating many findings at once.
 */
export function evaluate(
  input: EvaluationRequest,
  options: { explain?: boolean; idsUnique?: boolean } = {},
): EvaluationResult {
  const evaluations = prepareRules(input.rows, input.rules)(input.findings, options);
  return { findings: evaluations, engine: engineVerdict(evaluations) };
}

/**
 * How many finding–rule matches an evaluation makes (same row, damage and zone): each is one
 * judgement in its answer, and what its cost grows with. Counted without judging anything.
 */
export function countMatches(input: Pick<EvaluationRequest, 'rules' | 'findings'>): number {
  const byKind = new Map<string, { anyZone: number; zones: Map<string, number> }>();
  for (const rule of input.rules) {
    const key = `${rule.row}\u0000${rule.damage}`;
    let kind = byKind.get(key);
    if (!kind) byKind.set(key, (kind = { anyZone: 0, zones: new Map() }));
    if (rule.zones.includes('*')) kind.anyZone += 1;
    else
      for (const zone of new Set(rule.zones)) kind.zones.set(zone, (kind.zones.get(zone) ?? 0) + 1);
  }
  let matches = 0;
  for (const finding of input.findings) {
    const kind = byKind.get(`${finding.row}\u0000${finding.damage}`);
    if (kind) matches += kind.anyZone + (kind.zones.get(finding.zone) ?? 0);
  }
  return matches;
}
