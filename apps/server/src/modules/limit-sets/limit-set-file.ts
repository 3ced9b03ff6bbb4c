import { MAX_JSON_DEPTH, nestsWithin } from '../../lib/json-depth';
import type { LimitFileFormat } from '@emberline/contracts/limit-sets';
import { beyondActionKinds, ruleSchema, type Rule } from '@emberline/contracts/limits';
import type { z } from 'zod';
import { decodeUtf8, readCsv, unreadableFile, writeCsv } from '../../lib/csv';

/**
 * The CSV form of a revision's rules: one rule a line, a header row, units explicit (`mm`, `in`,
 * `mm2`, `in2`, `count`). Zones are separated by `;` (`*` for every zone); an interval or a
 * removal action is left empty when the rule has none; not_permitted is `yes` or `no`.
 */
export const LIMIT_CSV_COLUMNS = [
  'id',
  'title',
  'row',
  'zones',
  'damage',
  'measure',
  'unit',
  'serviceable_max',
  'repeat_max',
  'repeat_cycles',
  'repeat_hours',
  'repeat_days',
  'beyond_action',
  'beyond_cycles',
  'beyond_hours',
  'not_permitted',
  'max_per_airfoil',
  'max_total_per_airfoil',
  'max_airfoils_per_row',
  'max_adjacent_airfoils',
  'reference',
] as const;
type Column = (typeof LIMIT_CSV_COLUMNS)[number];
const REQUIRED: readonly Column[] = ['id', 'row', 'zones', 'damage', 'measure', 'unit'];

export function rulesToCsv(rules: readonly Rule[]): string {
  return writeCsv(
    LIMIT_CSV_COLUMNS,
    rules.map((rule) => [
      rule.id,
      rule.title,
      rule.row,
      rule.zones.join(';'),
      rule.damage,
      rule.measure,
      rule.unit,
      rule.serviceableMax,
      rule.repeatMax,
      rule.repeatInterval?.cycles ?? null,
      rule.repeatInterval?.hours ?? null,
      rule.repeatInterval?.days ?? null,
      rule.beyondAction?.kind ?? null,
      rule.beyondAction?.cycles ?? null,
      rule.beyondAction?.hours ?? null,
      rule.notPermitted ? 'yes' : 'no',
      rule.maxPerAirfoil,
      rule.maxTotalPerAirfoil,
      rule.maxAirfoilsPerRow,
      rule.maxAdjacentAirfoils,
      rule.reference,
    ]),
  );
}

export interface RuleLine {
  line: number;
  text: string;
  rule: Rule | null;
  reason: string | null;
}

/** The rule's field a schema issue is about, in the words of the CSV header. */
const columnOf: Record<string, Column> = {
  id: 'id',
  title: 'title',
  row: 'row',
  zones: 'zones',
  damage: 'damage',
  measure: 'measure',
  unit: 'unit',
  serviceableMax: 'serviceable_max',
  repeatMax: 'repeat_max',
  'repeatInterval.cycles': 'repeat_cycles',
  'repeatInterval.hours': 'repeat_hours',
  'repeatInterval.days': 'repeat_days',
  'beyondAction.kind': 'beyond_action',
  'beyondAction.cycles': 'beyond_cycles',
  'beyondAction.hours': 'beyond_hours',
  notPermitted: 'not_permitted',
  maxPerAirfoil: 'max_per_airfoil',
  maxTotalPerAirfoil: 'max_total_per_airfoil',
  maxAirfoilsPerRow: 'max_airfoils_per_row',
  maxAdjacentAirfoils: 'max_adjacent_airfoils',
  reference: 'reference',
};

function describeIssue(error: z.ZodError, csv: boolean): string {
  const issue = error.issues[0]!;
  const path = issue.path.join('.');
  const field = csv ? (columnOf[path] ?? columnOf[String(issue.path[0])] ?? path) : path;
  const message =
    issue.code === 'invalid_type'
      ? 'is missing or not a number'
      : issue.code === 'invalid_value'
        ? `is not one of ${(issue.values as unknown[]).join(', ')}`
        : issue.message;
  return `${field || 'the rule'} ${message}`;
}

const number = (text: string | undefined) => {
  const trimmed = (text ?? '').trim();
  return trimmed === '' ? null : Number(trimmed);
};

function yesNo(text: string | undefined): boolean | string {
  const value = (text ?? '').trim().toLowerCase();
  if (['', 'no', 'false', '0'].includes(value)) return false;
  if (['yes', 'true', '1'].includes(value)) return true;
  return value;
}

/** Reads a rules CSV: a header, one rule a line; each bad line refused with its reason. */
export function parseRulesCsv(bytes: Buffer): RuleLine[] {
  return readCsv(bytes, REQUIRED).map(({ line, text, values, reason }): RuleLine => {
    if (!values) return { line, text, rule: null, reason };
    const cycles = number(values.repeat_cycles);
    const hours = number(values.repeat_hours);
    const days = number(values.repeat_days);
    const kind = (values.beyond_action ?? '').trim();
    const candidate = {
      id: values.id,
      title: values.title ?? '',
      row: values.row,
      zones: (values.zones ?? '')
        .split(';')
        .map((zone) => zone.trim())
        .filter(Boolean),
      damage: values.damage,
      measure: values.measure,
      unit: values.unit,
      serviceableMax: number(values.serviceable_max),
      repeatMax: number(values.repeat_max),
      repeatInterval:
        cycles === null && hours === null && days === null ? null : { cycles, hours, days },
      beyondAction:
        kind === ''
          ? null
          : {
              kind,
              cycles: number(values.beyond_cycles),
              hours: number(values.beyond_hours),
            },
      notPermitted: yesNo(values.not_permitted),
      maxPerAirfoil: number(values.max_per_airfoil),
      maxTotalPerAirfoil: number(values.max_total_per_airfoil),
      maxAirfoilsPerRow: number(values.max_airfoils_per_row),
      maxAdjacentAirfoils: number(values.max_adjacent_airfoils),
      reference: values.reference ?? '',
    };
    if (typeof candidate.notPermitted === 'string')
      return { line, text, rule: null, reason: 'not_permitted must be yes or no' };
    if (kind !== '' && !(beyondActionKinds as readonly string[]).includes(kind))
      return {
        line,
        text,
        rule: null,
        reason: `beyond_action is not one of ${beyondActionKinds.join(', ')}`,
      };
    const parsed = ruleSchema.safeParse(candidate);
    if (!parsed.success)
      return { line, text, rule: null, reason: describeIssue(parsed.error, true) };
    return { line, text, rule: parsed.data, reason: null };
  });
}

/** Reads a rules JSON file: the export shape (an object with `rules`) or a bare array of rules. */
export function parseRulesJson(bytes: Buffer): RuleLine[] {
  let document: unknown;
  try {
    document = JSON.parse(decodeUtf8(bytes, 'UTF-8 text'));
  } catch (error) {
    if (error instanceof SyntaxError)
      throw unreadableFile(`The file is not JSON (${error.message}); nothing was imported.`);
    throw error;
  }
  if (!nestsWithin(document, MAX_JSON_DEPTH))
    throw unreadableFile(
      `The file nests lists and objects more than ${MAX_JSON_DEPTH} deep, which no rules file does; nothing was imported.`,
    );
  const rules = Array.isArray(document)
    ? document
    : document &&
        typeof document === 'object' &&
        Array.isArray((document as { rules?: unknown }).rules)
      ? (document as { rules: unknown[] }).rules
      : null;
  if (!rules)
    throw unreadableFile(
      'The JSON file has no list of rules: give the exported revision or an array of rules; nothing was imported.',
    );
  return rules.map((candidate, index) => {
    const text = JSON.stringify(candidate).slice(0, 300);
    const parsed = ruleSchema.safeParse(candidate);
    if (!parsed.success)
      return { line: index + 1, text, rule: null, reason: describeIssue(parsed.error, false) };
    return { line: index + 1, text, rule: parsed.data, reason: null };
  });
}

export function parseRulesFile(format: LimitFileFormat, bytes: Buffer): RuleLine[] {
  return format === 'csv' ? parseRulesCsv(bytes) : parseRulesJson(bytes);
}
