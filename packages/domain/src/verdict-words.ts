import type { LimitUnit, Rule, RuleJudgement } from '@emberline/contracts/limits';
import { atMost, MM_PER_INCH, MM2_PER_SQUARE_INCH, unitSymbols } from './units';

/** The words a rule is named by where people read it: its title, else its id. */
export function ruleName(rule: Pick<Rule, 'id' | 'title'>): string {
  return rule.title || rule.id;
}

const inMillimetres = (value: number, unit: LimitUnit) =>
  unit === 'in' ? value * MM_PER_INCH : unit === 'in2' ? value * MM2_PER_SQUARE_INCH : value;

const digits: Record<LimitUnit, number> = { mm: 2, mm2: 2, in: 4, in2: 5, count: 0 };
const metric: Record<LimitUnit, LimitUnit> = {
  mm: 'mm',
  mm2: 'mm2',
  in: 'mm',
  in2: 'mm2',
  count: 'count',
};

function amount(value: number, unit: LimitUnit): string {
  const text = value.toFixed(digits[unit]);
  return unit === 'count' ? text : `${text} ${unitSymbols[unit]}`;
}

/** A value in the rule's unit, in mm (mm²) first and in the rule's own unit beside it. */
function both(value: number, unit: LimitUnit): string {
  const mm = amount(inMillimetres(value, unit), metric[unit]);
  return metric[unit] === unit ? mm : `${mm} (${amount(value, unit)})`;
}

/**
 * What a verdict was compared with, in one line: "1.32 mm + 0.09 uncertainty, within the repeat
 * limit 1.50 mm (revision D-1, Cracks at the vane edges)". A rule written in inches shows its
 * inches beside the millimetres. The limit named is the first the value and its uncertainty stay
 * within, else the highest they pass.
 */
export function comparisonWords(
  judgement: Pick<RuleJudgement, 'value' | 'uncertainty' | 'unit'>,
  rule: Pick<Rule, 'id' | 'title' | 'serviceableMax' | 'repeatMax' | 'notPermitted'>,
  revision: string,
): string {
  const source = `(revision ${revision}, ${ruleName(rule)})`;
  if (rule.notPermitted) return `not permitted at all ${source}`;
  if (judgement.value === null) return `nothing measured to compare ${source}`;
  const { value, unit } = judgement;
  const uncertainty = judgement.uncertainty ?? 0;
  const measured =
    unit === 'count'
      ? `count ${amount(value, unit)}`
      : `${both(value, unit)} + ${amount(inMillimetres(uncertainty, unit), metric[unit]).replace(/ .*/, '')} uncertainty`;
  const limits: [string, number][] = [];
  if (rule.serviceableMax !== null) limits.push(['serviceable limit', rule.serviceableMax]);
  if (rule.repeatMax !== null) limits.push(['repeat limit', rule.repeatMax]);
  const top = value + uncertainty;
  const within = limits.find(([, limit]) => atMost(top, limit));
  const passed = limits.at(-1);
  const against = within
    ? `within the ${within[0]} ${both(within[1], unit)}`
    : passed
      ? `over the ${passed[0]} ${both(passed[1], unit)}`
      : 'no size limit';
  return `${measured}, ${against} ${source}`;
}
