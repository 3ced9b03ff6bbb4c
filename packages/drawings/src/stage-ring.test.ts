import { describe, expect, it } from 'vitest';
import {
  clockOfPositionOne,
  polar,
  stageRing,
  stageRingGeometry,
  type StageRingInput,
} from './stage-ring';
import { renderSvg, type SvgNode } from './svg';

const ring = (overrides: Partial<StageRingInput> = {}): StageRingInput => ({
  count: 38,
  positionOneClock: 12,
  direction: 'clockwise',
  viewpoint: 'aft looking forward',
  title: 'HPT stage 1 NGV',
  verdicts: new Map(),
  ...overrides,
});

const find = (node: SvgNode, predicate: (node: SvgNode) => boolean): SvgNode[] => [
  ...(predicate(node) ? [node] : []),
  ...node.children.flatMap((child) => find(child, predicate)),
];

describe('stage ring geometry', () => {
  it('has N sectors that close the circle without gaps', () => {
    for (const count of [1, 2, 18, 38, 64, 98]) {
      const { sectors } = stageRingGeometry(ring({ count }));
      expect(sectors).toHaveLength(count);
      const span = sectors.reduce((sum, sector) => sum + (sector.endAngle - sector.startAngle), 0);
      expect(span).toBeCloseTo(360, 9);
      for (const [index, sector] of sectors.entries()) {
        const next = sectors[(index + 1) % count]!;
        // The next sector starts where this one ends (compared around the circle).
        expect(((next.startAngle - sector.endAngle + 540) % 360) - 180).toBeCloseTo(0, 9);
      }
    }
  });

  it('puts position 1 at the stated clock position', () => {
    const geometry = stageRingGeometry(ring({ positionOneClock: 12 }));
    const [x, y] = geometry.sectors[0]!.markPoint;
    expect(x).toBeCloseTo(geometry.centre[0], 9);
    expect(y).toBeLessThan(geometry.centre[1]);

    const three = stageRingGeometry(ring({ positionOneClock: 3 }));
    const [x3, y3] = three.sectors[0]!.markPoint;
    expect(x3).toBeGreaterThan(three.centre[0]);
    expect(y3).toBeCloseTo(three.centre[1], 9);

    const six = stageRingGeometry(ring({ positionOneClock: 6 }));
    expect(six.sectors[0]!.markPoint[1]).toBeGreaterThan(six.centre[1]);
    expect(six.sectors[0]!.midAngle).toBe(180);
  });

  it('counts clockwise or counter-clockwise in the view drawn', () => {
    const clockwise = stageRingGeometry(ring({ count: 4 }));
    // From 12 o'clock clockwise: position 2 at 3 o'clock (right), 3 at 6, 4 at 9 (left).
    expect(clockwise.sectors.map((sector) => sector.midAngle)).toEqual([0, 90, 180, 270]);
    expect(clockwise.sectors[1]!.markPoint[0]).toBeGreaterThan(clockwise.centre[0]);

    const counter = stageRingGeometry(ring({ count: 4, direction: 'counter-clockwise' }));
    expect(counter.sectors.map((sector) => sector.midAngle)).toEqual([0, 270, 180, 90]);
    expect(counter.sectors[1]!.markPoint[0]).toBeLessThan(counter.centre[0]);
  });

  it('measures angles clockwise from 12 o’clock', () => {
    const [x, y] = polar([0, 0], 10, 90);
    expect(x).toBeCloseTo(10, 12);
    expect(y).toBeCloseTo(0, 12);
  });
});

describe('stage ring drawing', () => {
  it('marks each position by its worst verdict, with a word as well as a colour', () => {
    const drawing = stageRing(
      ring({
        verdicts: new Map([
          [4, 'beyond-limits'],
          [5, 'repeat-inspection'],
        ]),
        unviewed: new Set([20, 21]),
      }),
    );
    const sectors = find(drawing, (node) => node.attrs['data-position'] !== undefined);
    expect(sectors).toHaveLength(38);
    const of = (position: number) =>
      sectors.find((node) => node.attrs['data-position'] === position)!;
    expect(of(4).attrs['data-category']).toBe('beyond-limits');
    expect(of(5).attrs['data-category']).toBe('repeat-inspection');
    expect(of(6).attrs['data-category']).toBe('none');
    const titleOf = (position: number) =>
      of(position).children.find((child) => child.tag === 'title')!.text;
    expect(titleOf(4)).toBe('Position 4: Beyond limits');
    expect(titleOf(20)).toBe('Position 20: Not viewed');
    const legend = find(drawing, (node) => node.tag === 'text').map((node) => node.text);
    expect(legend).toEqual(
      expect.arrayContaining([
        'Serviceable',
        'Repeat inspection',
        'Review',
        'Beyond limits',
        'Not viewed',
      ]),
    );
    expect(drawing.attrs['aria-label']).toMatch(
      /position 1 at 12 o'clock, counted clockwise, seen aft looking forward/,
    );
  });

  it('renders as SVG text with its namespace, escaping what it writes', () => {
    const svg = renderSvg(stageRing(ring({ title: 'Liner <A & B>' })));
    expect(svg.startsWith('<svg xmlns="http://www.w3.org/2000/svg"')).toBe(true);
    expect(svg).toContain('Liner &lt;A &amp; B&gt;');
    expect(svg).not.toContain('<A & B>');
  });
});

describe('position 1 from the numbering words', () => {
  it('reads clock positions and the usual words', () => {
    expect(clockOfPositionOne("12 o'clock (top dead centre)")).toBe(12);
    expect(clockOfPositionOne('3 o’clock looking forward')).toBe(3);
    expect(clockOfPositionOne("4:30 o'clock")).toBe(4.5);
    expect(clockOfPositionOne('bottom dead centre')).toBe(6);
    expect(clockOfPositionOne('next to the igniter boss')).toBe(12);
  });
});
