import { z } from 'zod';
import { unitSymbols } from '@emberline/domain/units';
import { formatKey } from '../../../lib/format';
import {
  beyondActionKinds,
  ruleSchema,
  type BeyondAction,
  type Interval,
  type LimitUnit,
  type Rule,
} from '@emberline/contracts/limits';

const optional = z.number().finite().positive({ message: 'must be above 0' }).nullable();

/**
 * The rule editor's form: the contract's rule, with the repeat interval and the removal action
 * as flat fields (empty = none). `toRule` turns it back into the contract shape, which the
 * shared schema and the domain's consistency checks then judge.
 */
export const ruleFormSchema = ruleSchema.omit({ repeatInterval: true, beyondAction: true }).extend({
  title: z
    .string()
    .trim()
    .min(1, { message: 'Give the rule a short title, as people will read it' })
    .max(80, { message: 'Keep the title to 80 characters or fewer' }),
  zones: z.array(z.string()).min(1, { message: 'Pick at least one zone, or every zone' }),
  repeatCycles: optional,
  repeatHours: optional,
  repeatDays: optional,
  beyondKind: z.enum(['', ...beyondActionKinds]),
  beyondCycles: optional,
  beyondHours: optional,
});
export type RuleForm = z.infer<typeof ruleFormSchema>;

export function toRule(form: RuleForm): Rule {
  const { repeatCycles, repeatHours, repeatDays, beyondKind, beyondCycles, beyondHours, ...rest } =
    form;
  const repeatInterval: Interval | null =
    repeatCycles === null && repeatHours === null && repeatDays === null
      ? null
      : { cycles: repeatCycles, hours: repeatHours, days: repeatDays };
  const beyondAction: BeyondAction | null =
    beyondKind === ''
      ? null
      : {
          kind: beyondKind,
          cycles: beyondKind === 'remove-within' ? beyondCycles : null,
          hours: beyondKind === 'remove-within' ? beyondHours : null,
        };
  return { ...rest, repeatInterval, beyondAction };
}

export function fromRule(rule: Rule): RuleForm {
  const { repeatInterval, beyondAction, ...rest } = rule;
  return {
    ...rest,
    repeatCycles: repeatInterval?.cycles ?? null,
    repeatHours: repeatInterval?.hours ?? null,
    repeatDays: repeatInterval?.days ?? null,
    beyondKind: beyondAction?.kind ?? '',
    beyondCycles: beyondAction?.cycles ?? null,
    beyondHours: beyondAction?.hours ?? null,
  };
}

/** A new rule for a row: the first zone, a crack length in mm, no limits yet. */
export function blankRule(row: { key: string; zones: readonly string[] }, id: string): RuleForm {
  return fromRule({
    id,
    title: '',
    row: row.key,
    zones: [row.zones[0] ?? '*'],
    damage: 'crack',
    measure: 'length',
    unit: 'mm',
    serviceableMax: null,
    repeatMax: null,
    repeatInterval: null,
    beyondAction: null,
    notPermitted: false,
    maxPerAirfoil: null,
    maxTotalPerAirfoil: null,
    maxAirfoilsPerRow: null,
    maxAdjacentAirfoils: null,
    reference: '',
  });
}

export function formatLimit(value: number | null, unit: LimitUnit): string {
  if (value === null) return '—';
  // Six significant figures: a limit converted between units shows as transcribed, not as 0.0299999….
  const shown = Number(value.toPrecision(6));
  return unit === 'count' ? String(shown) : `${shown} ${unitSymbols[unit]}`;
}

export function formatInterval(interval: Interval | null): string {
  if (!interval) return '—';
  const parts = [
    interval.cycles !== null ? `${interval.cycles} cycles` : null,
    interval.hours !== null ? `${interval.hours} h` : null,
    interval.days !== null ? `${interval.days} days` : null,
  ].filter(Boolean);
  return parts.length > 0 ? parts.join(' or ') : '—';
}

const actionWords: Record<BeyondAction['kind'], string> = {
  'remove-before-next-flight': 'Remove before the next flight',
  'remove-within': 'Remove within',
  'remove-at-next-shop-visit': 'Remove at the next shop visit',
};
export const beyondActionLabels = actionWords;

export function formatBeyondAction(action: BeyondAction | null): string {
  if (!action) return '—';
  if (action.kind !== 'remove-within') return actionWords[action.kind];
  return `${actionWords[action.kind]} ${formatInterval({ cycles: action.cycles, hours: action.hours, days: null })}`;
}

/** A rule's fields as the rule form names them, for the changes a draft makes. */
export const ruleFieldLabels: Record<keyof Rule, string> = {
  id: 'Rule id',
  title: 'Title',
  row: 'Row',
  zones: 'Zones',
  damage: 'Damage',
  measure: 'Measure',
  unit: 'Unit',
  serviceableMax: 'Serviceable up to',
  repeatMax: 'Repeat inspection up to',
  repeatInterval: 'Repeat within',
  beyondAction: 'Beyond limits',
  maxPerAirfoil: 'Most damage per airfoil',
  maxTotalPerAirfoil: 'Most in total per airfoil',
  maxAirfoilsPerRow: 'Most airfoils per row',
  maxAdjacentAirfoils: 'Most adjacent airfoils',
  notPermitted: 'Not permitted',
  reference: 'Manual reference',
};

/**
 * A field's value in words: limits in the rule's unit, intervals and actions as the rules table
 * shows them, rows by their names, keys as words.
 */
export function ruleFieldWords(
  field: string,
  value: unknown,
  unit: LimitUnit,
  rowLabel: (key: string) => string,
): string {
  if (value === null || value === undefined || value === '') return 'none';
  switch (field) {
    case 'serviceableMax':
    case 'repeatMax':
      return formatLimit(value as number, unit);
    case 'repeatInterval':
      return formatInterval(value as Interval);
    case 'beyondAction':
      return formatBeyondAction(value as BeyondAction);
    case 'row':
      return rowLabel(String(value));
    case 'unit':
      return value === 'count' ? 'count' : unitSymbols[value as LimitUnit];
    case 'notPermitted':
      return value ? 'yes' : 'no';
    case 'zones':
      return (value as string[])
        .map((zone) => (zone === '*' ? 'every zone' : formatKey(zone)))
        .join(', ');
    case 'damage':
      return formatKey(String(value));
    default:
      return String(value);
  }
}
