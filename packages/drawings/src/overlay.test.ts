import { describe, expect, it } from 'vitest';
import { annotationOverlay, labelAnchor, overlayScale } from './overlay';
import { renderSvg, type SvgNode } from './svg';

const find = (node: SvgNode, predicate: (node: SvgNode) => boolean): SvgNode[] => [
  ...(predicate(node) ? [node] : []),
  ...node.children.flatMap((child) => find(child, predicate)),
];

describe('annotation overlay', () => {
  const overlay = annotationOverlay({
    width: 4000,
    height: 3000,
    calibration: { kind: 'reference', p1: [100, 100], p2: [500, 100], lengthMm: 10 },
    shapes: [
      {
        id: 'a',
        label: 'F1',
        detail: '1.25 mm',
        kind: 'polyline',
        points: [
          [600, 600],
          [625, 600],
          [625, 625],
        ],
        category: 'repeat-inspection',
      },
      {
        id: 'b',
        label: 'F2',
        kind: 'polygon',
        points: [
          [1000, 1000],
          [1100, 1000],
          [1050, 1080],
        ],
        category: 'beyond-limits',
        selected: true,
      },
      { id: 'c', label: 'F3', kind: 'point', points: [[3990, 5]], category: null },
    ],
  });

  it('draws in the image’s own pixel frame', () => {
    expect(overlay.attrs.viewBox).toBe('0 0 4000 3000');
  });

  it('draws every shape with its points in order and its label with the verdict word', () => {
    const shapes = find(overlay, (node) => node.attrs['data-shape'] !== undefined);
    expect(shapes.map((node) => node.attrs['data-shape'])).toEqual(['a', 'b', 'c']);
    const line = find(shapes[0]!, (node) => node.tag === 'polyline');
    expect(line[0]!.attrs.points).toBe('600,600 625,600 625,625');
    const labels = find(overlay, (node) => node.tag === 'text').map((node) => node.text);
    expect(labels).toEqual(
      expect.arrayContaining([
        'F1 · Repeat inspection',
        '1.25 mm',
        'F2 · Beyond limits',
        'F3',
        '10 mm',
      ]),
    );
    // The selected shape shows its vertices as handles.
    expect(find(shapes[1]!, (node) => node.tag === 'circle')).toHaveLength(3);
  });

  it('keeps labels of shapes at the edge inside the image', () => {
    const { font } = overlayScale(4000, 3000);
    const [x, y] = labelAnchor([[3990, 5]], 4000, 3000, font);
    expect(x).toBeLessThan(4000 - font);
    expect(y).toBeGreaterThan(font);
    expect(y).toBeLessThan(3000);
    // A shape in the open gets its label just above its highest point.
    const [ax, ay] = labelAnchor(
      [
        [500, 900],
        [520, 800],
      ],
      4000,
      3000,
      font,
    );
    expect(ax).toBe(520);
    expect(ay).toBeLessThan(800);
  });

  it('scales lines and text with the image so they read the same at any size', () => {
    expect(overlayScale(4000, 3000).stroke).toBeCloseTo(2.5 * overlayScale(1600, 1200).stroke, 9);
    expect(overlayScale(200, 100).font).toBe(12);
  });

  it('renders as SVG text', () => {
    expect(renderSvg(overlay)).toMatch(
      /^<svg xmlns="http:\/\/www.w3.org\/2000\/svg" viewBox="0 0 4000 3000"/,
    );
  });
});
