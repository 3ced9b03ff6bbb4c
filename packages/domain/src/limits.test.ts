import { describe, expect, it } from 'vitest';
import type { EvaluationFinding, EvaluationRequest, Rule } from '@emberline/contracts/limits';
import { circularRuns, compareActions, evaluate } from './limits';
import { ruleProblems } from './rules';

// Rules and findings for these tests are invented; nothing here comes from an engine manual.
function rule(overrides: Partial<Rule> = {}): Rule {
  return {
    id: 'R1',
    title: 'Invented test rule',
    row: 'hpt1-blade',
    zones: ['*'],
    damage: 'crack',
    measure: 'length',
    unit: 'mm',
    serviceableMax: 1,
    repeatMax: 2,
    repeatInterval: { cycles: 500, hours: null, days: null },
    beyondAction: { kind: 'remove-within', cycles: 50, hours: null },
    notPermitted: false,
    maxPerAirfoil: null,
    maxTotalPerAirfoil: null,
    maxAirfoilsPerRow: null,
    maxAdjacentAirfoils: null,
    reference: 'invented §1',
    ...overrides,
  };
}

let serial = 0;
function finding(overrides: Partial<EvaluationFinding> = {}): EvaluationFinding {
  serial += 1;
  return {
    id: `F${serial}`,
    row: 'hpt1-blade',
    position: 1,
    zone: 'leading-edge',
    damage: 'crack',
    lengthMm: null,
    widthMm: null,
    depthMm: null,
    areaMm2: null,
    count: null,
    uncertaintyMm: null,
    uncertaintyMm2: null,
    ...overrides,
  };
}

const rows = { 'hpt1-blade': { count: 10 }, 'hpt1-ngv': { count: 8 } };
const run = (rules: Rule[], findings: EvaluationFinding[]) =>
  evaluate({ rows, rules, findings } satisfies EvaluationRequest);
const only = (rules: Rule[], f: EvaluationFinding) => run(rules, [f]).findings[0]!;

describe('one rule, steps 1 to 6', () => {
  it('takes a value exactly on a limit as within it (limits are inclusive)', () => {
    expect(only([rule()], finding({ lengthMm: 1 }))).toMatchObject({
      category: 'serviceable',
      reasons: ['within-serviceable'],
      utilisation: 0.5,
    });
    expect(only([rule()], finding({ lengthMm: 2 }))).toMatchObject({
      category: 'repeat-inspection',
      reasons: ['within-repeat'],
      repeatInterval: { cycles: 500, hours: null, days: null },
    });
    expect(only([rule()], finding({ lengthMm: 2.0001 }))).toMatchObject({
      category: 'beyond-limits',
      reasons: ['exceeds-limit'],
      beyondAction: { kind: 'remove-within', cycles: 50, hours: null },
    });
  });

  it('judges mm measurements against inch limits, keeping a converted value on the limit (1e-9 tolerance)', () => {
    const inches = rule({ unit: 'in', serviceableMax: 0.03, repeatMax: 0.06 });
    expect(only([inches], finding({ lengthMm: 0.762 }))).toMatchObject({ category: 'serviceable' });
    expect(only([inches], finding({ lengthMm: 0.77 }))).toMatchObject({
      category: 'repeat-inspection',
    });
    expect(only([inches], finding({ lengthMm: 1.524 })).category).toBe('repeat-inspection');
    expect(only([inches], finding({ lengthMm: 1.53 })).category).toBe('beyond-limits');
  });

  it('judges areas in square inches', () => {
    const area = rule({
      damage: 'burn',
      measure: 'area',
      unit: 'in2',
      serviceableMax: 1,
      repeatMax: null,
      repeatInterval: null,
    });
    expect(only([area], finding({ damage: 'burn', areaMm2: 645.16 })).category).toBe('serviceable');
    expect(only([area], finding({ damage: 'burn', areaMm2: 645.2 })).category).toBe(
      'beyond-limits',
    );
  });

  it('lets the relative tolerance hold a value 1e-10 over a limit, and no more', () => {
    expect(only([rule()], finding({ lengthMm: 1 + 1e-10 })).category).toBe('serviceable');
    expect(only([rule()], finding({ lengthMm: 1 + 1e-7 })).category).toBe('repeat-inspection');
  });

  it('takes the verdict from value plus uncertainty and flags it indeterminate when that changes the band', () => {
    const result = only([rule()], finding({ lengthMm: 0.9, uncertaintyMm: 0.2 }));
    expect(result).toMatchObject({
      category: 'repeat-inspection',
      measuredCategory: 'serviceable',
      indeterminate: true,
    });
    expect(only([rule()], finding({ lengthMm: 0.5, uncertaintyMm: 0.2 }))).toMatchObject({
      category: 'serviceable',
      indeterminate: false,
    });
  });

  it('uses the area uncertainty for an area rule and the length uncertainty for a length rule', () => {
    const area = rule({
      id: 'A',
      damage: 'burn',
      measure: 'area',
      unit: 'mm2',
      serviceableMax: 10,
      repeatMax: null,
      repeatInterval: null,
    });
    expect(
      only([area], finding({ damage: 'burn', areaMm2: 9, uncertaintyMm: 5, uncertaintyMm2: 0.5 }))
        .category,
    ).toBe('serviceable');
    expect(
      only([area], finding({ damage: 'burn', areaMm2: 9, uncertaintyMm: 0, uncertaintyMm2: 1.5 }))
        .category,
    ).toBe('beyond-limits');
  });

  it('puts a finding without the measured value in review', () => {
    expect(only([rule()], finding({ lengthMm: null, depthMm: 0.1 }))).toMatchObject({
      category: 'review',
      reasons: ['missing-measurement'],
      utilisation: null,
    });
  });

  it('puts damage that is not permitted beyond limits whatever its size', () => {
    expect(
      only(
        [rule({ notPermitted: true, serviceableMax: null, repeatMax: null, repeatInterval: null })],
        finding({ lengthMm: 0.01 }),
      ),
    ).toMatchObject({
      category: 'beyond-limits',
      reasons: ['not-permitted'],
    });
  });

  it('passes a finding under a count-only rule by itself', () => {
    const countOnly = rule({
      serviceableMax: null,
      repeatMax: null,
      repeatInterval: null,
      maxPerAirfoil: 3,
    });
    expect(only([countOnly], finding({ lengthMm: 99 }))).toMatchObject({
      category: 'serviceable',
      reasons: ['count-rule-only'],
    });
  });

  it('never passes a finding that no rule matches', () => {
    const result = only(
      [rule({ zones: ['trailing-edge'] })],
      finding({ zone: 'leading-edge', lengthMm: 0.1 }),
    );
    expect(result).toMatchObject({
      category: 'review',
      reasons: ['no-matching-rule'],
      ruleId: null,
    });
    expect(only([rule({ damage: 'burn' })], finding({ lengthMm: 0.1 })).category).toBe('review');
    expect(only([rule({ row: 'hpt1-ngv' })], finding({ lengthMm: 0.1 })).category).toBe('review');
  });

  it('explains the working of every matching rule', () => {
    const result = only(
      [rule({ unit: 'in', serviceableMax: 0.03, repeatMax: 0.06 })],
      finding({ lengthMm: 1.27, uncertaintyMm: 0.254 }),
    );
    expect(result.judgements).toHaveLength(1);
    expect(result.judgements[0]!.value).toBeCloseTo(0.05, 12);
    expect(result.judgements[0]!.uncertainty).toBeCloseTo(0.01, 12);
    expect(result.judgements[0]!.unit).toBe('in');
  });
});

describe('several matching rules', () => {
  it('lets the worse of two rules govern, and names it', () => {
    const general = rule({
      id: 'general',
      serviceableMax: 5,
      repeatMax: null,
      repeatInterval: null,
    });
    const edge = rule({ id: 'edge', zones: ['leading-edge'], serviceableMax: 0.5, repeatMax: 1 });
    const result = only([general, edge], finding({ lengthMm: 1.5 }));
    expect(result).toMatchObject({ category: 'beyond-limits', ruleId: 'edge' });
    expect(result.judgements.map((judgement) => [judgement.ruleId, judgement.category])).toEqual([
      ['general', 'serviceable'],
      ['edge', 'beyond-limits'],
    ]);
  });

  it('takes the strictest of cycles, hours and days separately among rules tied at repeat inspection', () => {
    const a = rule({ id: 'a', repeatInterval: { cycles: 500, hours: null, days: 180 } });
    const b = rule({ id: 'b', repeatInterval: { cycles: 800, hours: 1000, days: 90 } });
    expect(only([a, b], finding({ lengthMm: 1.5 })).repeatInterval).toEqual({
      cycles: 500,
      hours: 1000,
      days: 90,
    });
  });

  it('takes the most restrictive removal among rules tied beyond limits', () => {
    const actions = [
      { kind: 'remove-at-next-shop-visit', cycles: null, hours: null },
      { kind: 'remove-within', cycles: 50, hours: null },
      { kind: 'remove-within', cycles: 25, hours: 80 },
    ] as const;
    const rules = actions.map((beyondAction, index) => rule({ id: `r${index}`, beyondAction }));
    expect(only(rules, finding({ lengthMm: 9 })).beyondAction).toEqual({
      kind: 'remove-within',
      cycles: 25,
      hours: 80,
    });
    const now = rule({
      id: 'now',
      beyondAction: { kind: 'remove-before-next-flight', cycles: null, hours: null },
    });
    expect(only([...rules, now], finding({ lengthMm: 9 })).beyondAction?.kind).toBe(
      'remove-before-next-flight',
    );
  });

  it('names the tied rule with the higher utilisation, then the one listed first', () => {
    const tight = rule({ id: 'tight', serviceableMax: 2, repeatMax: null, repeatInterval: null });
    const loose = rule({ id: 'loose', serviceableMax: 4, repeatMax: null, repeatInterval: null });
    expect(only([loose, tight], finding({ lengthMm: 1 })).ruleId).toBe('tight');
    const twin = rule({ id: 'twin', serviceableMax: 2, repeatMax: null, repeatInterval: null });
    expect(only([tight, twin], finding({ lengthMm: 1 })).ruleId).toBe('tight');
    expect(only([twin, tight], finding({ lengthMm: 1 })).ruleId).toBe('twin');
  });
});

describe('count, total, row and adjacency limits', () => {
  it('puts every finding at a position beyond limits when there are more than maxPerAirfoil', () => {
    const perAirfoil = rule({ maxPerAirfoil: 1 });
    const result = run(
      [perAirfoil],
      [
        finding({ position: 3, lengthMm: 0.1 }),
        finding({ position: 3, lengthMm: 0.2 }),
        finding({ position: 4, lengthMm: 0.1 }),
      ],
    );
    expect(result.findings.map((f) => f.category)).toEqual([
      'beyond-limits',
      'beyond-limits',
      'serviceable',
    ]);
    expect(result.findings[0]).toMatchObject({
      measuredCategory: 'beyond-limits',
      reasons: ['count-per-airfoil'],
      beyondAction: { kind: 'remove-within', cycles: 50 },
    });
  });

  it('adds values plus uncertainties at a position against maxTotalPerAirfoil, inclusive', () => {
    const total = rule({
      serviceableMax: 1,
      repeatMax: null,
      repeatInterval: null,
      maxTotalPerAirfoil: 2,
    });
    const onLimit = run(
      [total],
      [
        finding({ position: 2, lengthMm: 0.9, uncertaintyMm: 0.1 }),
        finding({ position: 2, lengthMm: 0.9, uncertaintyMm: 0.1 }),
      ],
    );
    expect(onLimit.findings.map((f) => f.category)).toEqual(['serviceable', 'serviceable']);
    const over = run(
      [total],
      [
        finding({ position: 2, lengthMm: 0.9, uncertaintyMm: 0.1 }),
        finding({ position: 2, lengthMm: 0.9, uncertaintyMm: 0.15 }),
        finding({ position: 2, lengthMm: null }),
      ],
    );
    expect(over.findings.map((f) => f.category)).toEqual([
      'beyond-limits',
      'beyond-limits',
      'beyond-limits',
    ]);
    expect(over.findings[0]!.reasons).toEqual(['total-per-airfoil']);
  });

  it('puts every matched finding beyond limits when more than maxAirfoilsPerRow positions carry one', () => {
    const perRow = rule({ maxAirfoilsPerRow: 2 });
    const two = run(
      [perRow],
      [finding({ position: 1, lengthMm: 0.1 }), finding({ position: 5, lengthMm: 0.1 })],
    );
    expect(two.findings.every((f) => f.category === 'serviceable')).toBe(true);
    const three = run(
      [perRow],
      [
        finding({ position: 1, lengthMm: 0.1 }),
        finding({ position: 5, lengthMm: 0.1 }),
        finding({ position: 9, lengthMm: 0.1 }),
      ],
    );
    expect(three.findings.map((f) => f.reasons)).toEqual([
      ['airfoils-per-row'],
      ['airfoils-per-row'],
      ['airfoils-per-row'],
    ]);
  });

  it('counts adjacency around the ring, so that position 10 is next to position 1', () => {
    const adjacent = rule({ maxAdjacentAirfoils: 2 });
    const wrapped = run(
      [adjacent],
      [
        finding({ position: 10, lengthMm: 0.1 }),
        finding({ position: 1, lengthMm: 0.1 }),
        finding({ position: 2, lengthMm: 0.1 }),
        finding({ position: 6, lengthMm: 0.1 }),
      ],
    );
    expect(wrapped.findings.map((f) => f.category)).toEqual([
      'beyond-limits',
      'beyond-limits',
      'beyond-limits',
      'serviceable',
    ]);
    expect(wrapped.findings[0]!.reasons).toEqual(['adjacent-airfoils']);
    const apart = run(
      [adjacent],
      [finding({ position: 10, lengthMm: 0.1 }), finding({ position: 2, lengthMm: 0.1 })],
    );
    expect(apart.findings.every((f) => f.category === 'serviceable')).toBe(true);
  });

  it('finds runs around a ring, including the whole ring', () => {
    expect(circularRuns([10, 1, 2, 5], 10)).toEqual([[10, 1, 2], [5]]);
    expect(circularRuns([1, 2, 3], 3)).toEqual([[1, 2, 3]]);
    expect(circularRuns([], 3)).toEqual([]);
  });
});

describe('the engine verdict', () => {
  it('takes the worst category, counts each, the strictest interval and the removals most restrictive first', () => {
    const crack = rule({ id: 'crack' });
    const nick = rule({
      id: 'nick',
      damage: 'nick',
      measure: 'depth',
      serviceableMax: 0.1,
      repeatMax: 0.2,
      repeatInterval: { cycles: 300, hours: 900, days: null },
      beyondAction: { kind: 'remove-at-next-shop-visit', cycles: null, hours: null },
    });
    const result = run(
      [crack, nick],
      [
        finding({ lengthMm: 0.5 }),
        finding({ lengthMm: 1.5 }),
        finding({ damage: 'nick', depthMm: 0.15 }),
        finding({ damage: 'nick', depthMm: 0.5 }),
        finding({ lengthMm: 3 }),
        finding({ damage: 'burn', areaMm2: 1 }),
      ],
    );
    expect(result.engine).toEqual({
      category: 'beyond-limits',
      counts: { serviceable: 1, 'repeat-inspection': 2, review: 1, 'beyond-limits': 2 },
      repeatInterval: { cycles: 300, hours: 900, days: null },
      beyondActions: [
        { kind: 'remove-within', cycles: 50, hours: null },
        { kind: 'remove-at-next-shop-visit', cycles: null, hours: null },
      ],
    });
  });

  it('is serviceable with no findings', () => {
    expect(run([rule()], []).engine).toMatchObject({
      category: 'serviceable',
      repeatInterval: null,
      beyondActions: [],
    });
  });

  it('orders removals: before next flight, within fewest cycles then hours, next shop visit', () => {
    const list = [
      { kind: 'remove-at-next-shop-visit', cycles: null, hours: null },
      { kind: 'remove-within', cycles: 50, hours: 200 },
      { kind: 'remove-within', cycles: 50, hours: 100 },
      { kind: 'remove-within', cycles: null, hours: 10 },
      { kind: 'remove-before-next-flight', cycles: null, hours: null },
    ] as const;
    expect([...list].sort(compareActions)).toEqual([list[4], list[2], list[1], list[3], list[0]]);
  });
});

describe('input the evaluation refuses', () => {
  const refuse = (rules: Rule[], findings: EvaluationFinding[], message: RegExp) =>
    expect(() => run(rules, findings)).toThrowError(message);

  it('names a finding at a position outside its row, on an unknown row, twice over, or with a negative value', () => {
    refuse(
      [rule()],
      [finding({ position: 11 })],
      /position 11, outside hpt1-blade \(positions 1 to 10\)/,
    );
    refuse([rule()], [finding({ position: 0 })], /position 0/);
    refuse(
      [rule()],
      [finding({ row: 'lpt3-blade' })],
      /row "lpt3-blade", which this engine model does not have/,
    );
    refuse(
      [rule()],
      [finding({ id: 'twin' }), finding({ id: 'twin' })],
      /finding twin appears twice/,
    );
    refuse([rule()], [finding({ lengthMm: -0.1 })], /negative lengthMm/);
    // Names an object has of its own are no rows either.
    for (const row of ['toString', 'constructor', '__proto__'])
      refuse([rule()], [finding({ row })], /which this engine model does not have/);
    refuse([rule()], [finding({ position: Number.NaN })], /position NaN/);
  });

  it('names a rule that would pass everything, an inverted band, a band without interval, a wrong unit or an unknown row', () => {
    refuse(
      [rule({ serviceableMax: null, repeatMax: null, repeatInterval: null })],
      [],
      /rule R1 has no limit/,
    );
    refuse(
      [rule({ serviceableMax: 2, repeatMax: 1 })],
      [],
      /repeat limit \(1 mm\) is below the serviceable limit \(2 mm\)/,
    );
    refuse(
      [rule({ repeatInterval: { cycles: null, hours: null, days: null } })],
      [],
      /repeat band but no repeat interval/,
    );
    refuse([rule({ repeatInterval: null })], [], /repeat band but no repeat interval/);
    refuse([rule({ measure: 'area', unit: 'mm' })], [], /measures area in "mm": use mm2 or in2/);
    refuse([rule({ measure: 'count', unit: 'in' })], [], /use count/);
    refuse([rule({ row: 'lpt9-ngv' })], [], /rule R1 is for the row "lpt9-ngv"/);
    refuse([rule(), rule()], [], /rule R1 appears twice/);
    refuse(
      [rule({ beyondAction: { kind: 'remove-within', cycles: null, hours: null } })],
      [],
      /needs a number of cycles or hours/,
    );
  });
});

describe('ruleProblems', () => {
  const modelRows = [{ key: 'hpt1-blade', zones: ['leading-edge', 'tip'] }];

  it('names every bad rule at once and passes the good ones', () => {
    const problems = ruleProblems(
      [
        rule({ id: 'ok' }),
        rule({ id: 'units', measure: 'area', unit: 'mm' }),
        rule({ id: 'zone', zones: ['platform'] }),
        rule({ id: 'bands', serviceableMax: 2, repeatMax: 1 }),
        rule({ id: 'ok' }),
        rule({ id: 'row', row: 'lpt1-blade' }),
      ],
      modelRows,
    );
    expect(problems[0]).toBeNull();
    expect(problems[1]).toMatch(/measures area in "mm": use mm2 or in2/);
    expect(problems[2]).toMatch(/zone "platform", which hpt1-blade does not have/);
    expect(problems[3]).toMatch(/repeat limit \(1 mm\) is below the serviceable limit \(2 mm\)/);
    expect(problems[4]).toMatch(/appears twice/);
    expect(problems[5]).toMatch(/row "lpt1-blade", which this engine model does not have/);
  });
});
