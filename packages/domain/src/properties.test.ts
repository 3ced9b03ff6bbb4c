import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { damageTypes, type EvaluationFinding, type Rule } from '@emberline/contracts/limits';
import type { Calibration } from '@emberline/contracts/measurement';
import { evaluate } from './limits';
import { measure } from './measurement';

const rank = { serviceable: 0, 'repeat-inspection': 1, review: 2, 'beyond-limits': 3 } as const;
const rows = { a: { count: 12 }, b: { count: 6 } };
const zones = ['leading-edge', 'trailing-edge', 'tip'];

// Image points to a thousandth of a pixel: finer than any pick, and free of subnormal numbers.
const coordinate = fc.integer({ min: -2_000_000, max: 2_000_000 }).map((value) => value / 1000);
const point = fc.tuple(coordinate, coordinate);

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
      title: 'Invented property rule',
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
  // Distinct points: a line or outline with the same point twice in a row is refused (and tested
  // so in measurement.test.ts), so every shape drawn here must measure.
  const distinctPoints = fc.uniqueArray(point, {
    minLength: 3,
    maxLength: 8,
    selector: ([x, y]) => `${x},${y}`,
  });
  const calibration: Calibration = {
    kind: 'reference',
    p1: [0, 0],
    p2: [250, 0],
    lengthMm: 12.7,
  };
  /** Twice the signed shoelace area, written out here so the property does not lean on the code. */
  const twiceSignedArea = (points: [number, number][]) =>
    points.reduce((sum, [x, y], index) => {
      const [nx, ny] = points[(index + 1) % points.length]!;
      return sum + x * ny - nx * y;
    }, 0);

  it('scales lengths linearly when the drawn line is scaled on the image', () => {
    fc.assert(
      fc.property(distinctPoints, fc.double({ min: 0.1, max: 10, noNaN: true }), (points, k) => {
        const scaled = points.map(([x, y]): [number, number] => [x * k, y * k]);
        const line = measure(calibration, { kind: 'polyline', points });
        const scaledLine = measure(calibration, { kind: 'polyline', points: scaled });
        expect(scaledLine.lengthMm! / (line.lengthMm! * k)).toBeCloseTo(1, 9);
      }),
      { numRuns: 300 },
    );
  });

  it('scales areas quadratically when the drawn outline is scaled on the image', () => {
    fc.assert(
      fc.property(distinctPoints, fc.double({ min: 0.1, max: 10, noNaN: true }), (points, k) => {
        // A flat outline (all points on one line) has no area and is refused at any scale.
        fc.pre(Math.abs(twiceSignedArea(points)) > 1e-6);
        const scaled = points.map(([x, y]): [number, number] => [x * k, y * k]);
        const area = measure(calibration, { kind: 'polygon', points });
        const scaledArea = measure(calibration, { kind: 'polygon', points: scaled });
        expect(scaledArea.areaMm2! / (area.areaMm2! * k * k)).toBeCloseTo(1, 9);
      }),
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
