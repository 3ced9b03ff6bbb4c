import { describe, expect, it } from 'vitest';
import { ruleSchema, type Rule } from '@emberline/contracts/limits';
import {
  blankRule,
  formatBeyondAction,
  formatInterval,
  formatLimit,
  fromRule,
  ruleFormSchema,
  toRule,
} from './rule-form';

// An invented rule: nothing here comes from an engine manual.
const rule: Rule = {
  id: 'hpt1-blade.crack.edges',
  title: 'Cracks at the blade edges',
  row: 'hpt1-blade',
  zones: ['leading-edge', 'trailing-edge'],
  damage: 'crack',
  measure: 'length',
  unit: 'mm',
  serviceableMax: 0.5,
  repeatMax: 1.5,
  repeatInterval: { cycles: 200, hours: null, days: null },
  beyondAction: { kind: 'remove-within', cycles: 25, hours: null },
  notPermitted: false,
  maxPerAirfoil: null,
  maxTotalPerAirfoil: null,
  maxAirfoilsPerRow: 3,
  maxAdjacentAirfoils: null,
  reference: 'invented fig. 612',
};

describe('the rule form', () => {
  it('turns a rule into form fields and back unchanged', () => {
    const form = fromRule(rule);
    expect(ruleFormSchema.parse(form)).toEqual(form);
    expect(toRule(form)).toEqual(rule);
    expect(ruleSchema.parse(toRule(form))).toEqual(rule);
  });

  it('reads empty interval and action fields as none', () => {
    const form = { ...fromRule(rule), repeatCycles: null, beyondKind: '' as const };
    expect(toRule(form)).toMatchObject({ repeatInterval: null, beyondAction: null });
  });

  it('drops the cycles and hours of an action that takes none', () => {
    const form = { ...fromRule(rule), beyondKind: 'remove-at-next-shop-visit' as const };
    expect(toRule(form).beyondAction).toEqual({
      kind: 'remove-at-next-shop-visit',
      cycles: null,
      hours: null,
    });
  });

  it('refuses a rule without zones and a zero interval', () => {
    const result = ruleFormSchema.safeParse({ ...fromRule(rule), zones: [], repeatCycles: 0 });
    expect(result.success).toBe(false);
    expect(result.error?.issues.map((issue) => issue.path[0]).sort()).toEqual([
      'repeatCycles',
      'zones',
    ]);
  });

  it('starts a new rule on the row’s first zone', () => {
    expect(blankRule({ key: 'hpt1-ngv', zones: ['leading-edge'] }, 'new-1')).toMatchObject({
      id: 'new-1',
      row: 'hpt1-ngv',
      zones: ['leading-edge'],
      beyondKind: '',
    });
  });

  it('says intervals and actions in words', () => {
    expect(formatInterval({ cycles: 200, hours: 400, days: null })).toBe('200 cycles or 400 h');
    expect(formatBeyondAction(rule.beyondAction)).toBe('Remove within 25 cycles');
    expect(formatLimit(1.2 / 25.4, 'in')).toBe('0.0472441 in');
    expect(formatLimit(3, 'count')).toBe('3');
  });
});
