import type { LimitUnit, Measure, Rule } from '@emberline/contracts/limits';
import { DomainError } from './errors';
import { unitSymbols } from './units';

/*
 * The checks of a damage-limit rule, apart from judging findings with it (limits.ts): the rule
 * editor, the import and publication run them, and the evaluation runs them before it judges.
 */

const unitsOf: Record<Measure, readonly LimitUnit[]> = {
  length: ['mm', 'in'],
  width: ['mm', 'in'],
  depth: ['mm', 'in'],
  area: ['mm2', 'in2'],
  count: ['count'],
};

/** Whether a rule judges through a count, total, row or adjacency limit. */
export function hasCountLimit(rule: Rule): boolean {
  return (
    rule.maxPerAirfoil !== null ||
    rule.maxTotalPerAirfoil !== null ||
    rule.maxAirfoilsPerRow !== null ||
    rule.maxAdjacentAirfoils !== null
  );
}

function describeLimit(value: number, unit: LimitUnit): string {
  return `${value} ${unitSymbols[unit]}`.trim();
}

/**
 * Refuses a rule whose zones the row does not have (`*` stands for any zone). Kept apart from
 * validateRules because the evaluation contract gives rows without their zones.
 */
export function validateRuleZones(
  rules: readonly Rule[],
  zonesByRow: ReadonlyMap<string, readonly string[]>,
): void {
  rules.forEach((rule, index) => {
    const zones = zonesByRow.get(rule.row);
    if (!zones) return;
    const unknown = rule.zones.filter((zone) => zone !== '*' && !zones.includes(zone));
    if (unknown.length > 0)
      throw new DomainError(
        `rule ${rule.id} names the zone "${unknown[0]}", which ${rule.row} does not have (it has ${zones.join(', ')})`,
        ['rules', index, 'zones'],
      );
    if (rule.zones.includes('*') && rule.zones.length > 1)
      throw new DomainError(
        `rule ${rule.id}: "*" already means every zone; list zones or give "*" alone`,
        ['rules', index, 'zones'],
      );
  });
}

/**
 * Refuses a rule set that would judge wrongly: a rule with no limit (it would pass everything), a
 * repeat limit below the serviceable one, a repeat band without an interval, a unit that does not
 * fit the measure, a row the engine does not have, a removal "within" no cycles or hours.
 */
export function validateRules(rules: readonly Rule[], rowKeys: ReadonlySet<string> | null): void {
  const seen = new Set<string>();
  rules.forEach((rule, index) => {
    const at = (field: string) => ['rules', index, field];
    const name = `rule ${rule.id}`;
    if (seen.has(rule.id))
      throw new DomainError(`${name} appears twice: every rule needs its own id`, at('id'));
    seen.add(rule.id);
    if (rowKeys && !rowKeys.has(rule.row))
      throw new DomainError(
        `${name} is for the row "${rule.row}", which this engine model does not have`,
        at('row'),
      );
    if (!unitsOf[rule.measure].includes(rule.unit)) {
      throw new DomainError(
        `${name} measures ${rule.measure} in "${rule.unit}": use ${unitsOf[rule.measure].join(' or ')}`,
        at('unit'),
      );
    }
    if (
      !rule.notPermitted &&
      rule.serviceableMax === null &&
      rule.repeatMax === null &&
      !hasCountLimit(rule)
    ) {
      throw new DomainError(
        `${name} has no limit and is not "not permitted": it would pass every finding`,
        at('serviceableMax'),
      );
    }
    if (
      rule.serviceableMax !== null &&
      rule.repeatMax !== null &&
      rule.repeatMax < rule.serviceableMax
    ) {
      throw new DomainError(
        `${name}: the repeat limit (${describeLimit(rule.repeatMax, rule.unit)}) is below the serviceable limit (${describeLimit(rule.serviceableMax, rule.unit)})`,
        at('repeatMax'),
      );
    }
    const interval = rule.repeatInterval;
    if (
      rule.repeatMax !== null &&
      (!interval || (interval.cycles === null && interval.hours === null && interval.days === null))
    ) {
      throw new DomainError(
        `${name} has a repeat band but no repeat interval: give cycles, hours or days`,
        at('repeatInterval'),
      );
    }
    if (
      rule.beyondAction?.kind === 'remove-within' &&
      rule.beyondAction.cycles === null &&
      rule.beyondAction.hours === null
    ) {
      throw new DomainError(
        `${name}: "remove within" needs a number of cycles or hours`,
        at('beyondAction'),
      );
    }
  });
}

/**
 * Each rule's first problem, or null when it has none: the checks of validateRules and
 * validateRuleZones, rule by rule, so that an editor or an import can name every bad rule at once.
 */
export function ruleProblems(
  rules: readonly Rule[],
  modelRows: readonly { key: string; zones: readonly string[] }[],
): (string | null)[] {
  const rowKeys = new Set(modelRows.map((row) => row.key));
  const zonesByRow = new Map(modelRows.map((row) => [row.key, row.zones]));
  const seen = new Set<string>();
  return rules.map((rule) => {
    if (seen.has(rule.id)) return `rule ${rule.id} appears twice: every rule needs its own id`;
    seen.add(rule.id);
    try {
      validateRules([rule], rowKeys);
      validateRuleZones([rule], zonesByRow);
      return null;
    } catch (error) {
      if (error instanceof DomainError) return error.message;
      throw error;
    }
  });
}
