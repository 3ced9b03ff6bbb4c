import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { damageTypes, type EvaluationFinding, type Rule } from '@emberline/contracts/limits';
import type { Calibration } from '@emberline/contracts/measurement';
import { evaluate } from './limits';
import { measure } from './measurement';

const rank = { serviceable: 0, 'repeat-inspection': 1, review: 2, 'beyond-limits': 3 } as const;
const rows = { a: { count: 12 }, b: { count: 6 } };
const zones = ['leading-edge', 'trailing-edge', 'tip'];

const point = fc.tuple(
  fc.double({ min: -2000, max: 2000, noNaN: true }),
  fc.double({ min: -2000, max: 2000, noNaN: true }),
);

const ruleArbitrary: fc.Arbitrary<Rule> = fc
  .record({
    row: fc.constantFrom('a', 'b'),
    zones: fc.oneof(fc.constant<string[]>(['*']), fc.subarray(zones, { minLength: 1 })),
    damage: fc.constantFrom(...damageTypes.slice(0, 3)),
    serviceableMax: fc.option(fc.double({ min: 0, max: 5, noNaN: true }), { nil: null }),
    band: fc.option(fc.double({ min: 0, max: 5, noNaN: true }), { nil: null }),
    notPermitted: fc.boolean(),
    maxPerAirfoil: fc.option(fc.integer({ min: 0, max: 3 }), { nil: null }),
    maxAdjacentAirfoils: fc.option(fc.integer({ min: 0, max: 4 }), { nil: null }),
  })
  .map(({ band, ...r }) => {
    const repeatMax = band === null ? null : (r.serviceableMax ?? 0) + band;
    const base: Rule = {
      id: 'x',
      row: r.row,
      zones: r.zones,
      damage: r.damage,
      measure: 'length',
      unit: 'mm',
      serviceableMax: r.serviceableMax,
      repeatMax,
      repeatInterval: repeatMax === null ? null : { cycles: 400, hours: null, days: null },
      beyondAction: { kind: 'remove-within', cycles: 30, hours: null },
      notPermitted: r.notPermitted,
      maxPerAirfoil: r.maxPerAirfoil,
      maxTotalPerAirfoil: null,
      maxAirfoilsPerRow: null,
      maxAdjacentAirfoils: r.maxAdjacentAirfoils,
      reference: 'invented',
    };
    // A rule with no limit at all is refused by validation; give such a one a count limit.
    return base.serviceableMax === null &&
      base.repeatMax === null &&
      !base.notPermitted &&
      base.maxPerAirfoil === null &&
      base.maxAdjacentAirfoils === null
      ? { ...base, maxPerAirfoil: 2 }
      : base;
  });

const rulesArbitrary = fc
  .array(ruleArbitrary, { maxLength: 6 })
  .map((list) => list.map((rule, index) => ({ ...rule, id: `R${index}` })));

const findingArbitrary = fc.record({
  row: fc.constantFrom('a', 'b'),
  position: fc.integer({ min: 1, max: 6 }),
  zone: fc.constantFrom(...zones),
  damage: fc.constantFrom(...damageTypes.slice(0, 4)),
  lengthMm: fc.option(fc.double({ min: 0, max: 8, noNaN: true }), { nil: null }),
  uncertaintyMm: fc.option(fc.double({ min: 0, max: 1, noNaN: true }), { nil: null }),
});

const findingsArbitrary = fc.array(findingArbitrary, { maxLength: 15 }).map((list) =>
  list.map((f, index): EvaluationFinding => ({
    ...f,
    id: `F${index}`,
    widthMm: null,
    depthMm: null,
    areaMm2: null,
    count: null,
    uncertaintyMm2: null,
  })),
);

describe('invariants (fast-check)', () => {
  it('scales lengths linearly and areas quadratically when the drawn shape is scaled on the image', () => {
    const calibration: Calibration = {
      kind: 'reference',
      p1: [0, 0],
      p2: [250, 0],
      lengthMm: 12.7,
    };
    fc.assert(
      fc.property(
        fc.array(point, { minLength: 3, maxLength: 8 }),
        fc.double({ min: 0.1, max: 10, noNaN: true }),
        (points, k) => {
          const scaled = points.map(([x, y]): [number, number] => [x * k, y * k]);
          let line: ReturnType<typeof measure>;
          try {
            line = measure(calibration, { kind: 'polyline', points });
          } catch {
            return true; // repeated points: refused, nothing to scale
          }
          const scaledLine = measure(calibration, { kind: 'polyline', points: scaled });
          expect(scaledLine.lengthMm!).toBeCloseTo(line.lengthMm! * k, 6);
          try {
            const area = measure(calibration, { kind: 'polygon', points });
            const scaledArea = measure(calibration, { kind: 'polygon', points: scaled });
            expect(scaledArea.areaMm2! / (area.areaMm2! * k * k)).toBeCloseTo(1, 9);
          } catch {
            // a flat outline is refused at either scale
          }
          return true;
        },
      ),
      { numRuns: 300 },
    );
  });

  it('never judges serviceable a finding that no rule matches', () => {
    fc.assert(
      fc.property(rulesArbitrary, findingsArbitrary, (rules, findings) => {
        const result = evaluate({ rows, rules, findings });
        findings.forEach((f, index) => {
          const matched = rules.some(
            (r) =>
              r.row === f.row &&
              r.damage === f.damage &&
              (r.zones.includes('*') || r.zones.includes(f.zone)),
          );
          if (!matched) expect(result.findings[index]!.category).not.toBe('serviceable');
        });
      }),
      { numRuns: 500 },
    );
  });

  it('never improves the engine verdict by adding a finding', () => {
    fc.assert(
      fc.property(rulesArbitrary, findingsArbitrary, findingArbitrary, (rules, findings, extra) => {
        const before = evaluate({ rows, rules, findings }).engine.category;
        const added: EvaluationFinding = {
          ...extra,
          id: 'extra',
          widthMm: null,
          depthMm: null,
          areaMm2: null,
          count: null,
          uncertaintyMm2: null,
        };
        const after = evaluate({ rows, rules, findings: [...findings, added] }).engine.category;
        expect(rank[after]).toBeGreaterThanOrEqual(rank[before]);
      }),
      { numRuns: 500 },
    );
  });

  it('never makes a verdict better than its measured category', () => {
    fc.assert(
      fc.property(rulesArbitrary, findingsArbitrary, (rules, findings) => {
        for (const f of evaluate({ rows, rules, findings }).findings)
          expect(rank[f.category]).toBeGreaterThanOrEqual(rank[f.measuredCategory]);
      }),
      { numRuns: 300 },
    );
  });
});
