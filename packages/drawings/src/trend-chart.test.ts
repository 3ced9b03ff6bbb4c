import { describe, expect, it } from 'vitest';
import { renderSvg } from './svg';
import { trendChart } from './trend-chart';

describe('the trend chart of a damage series', () => {
  const points = [
    { csn: 1000, value: 1, uncertainty: 0.1 },
    { csn: 1200, value: 1.2, uncertainty: 0.1 },
    { csn: 1400, value: 1.4, uncertainty: 0.1 },
  ];

  it('draws each measurement with its uncertainty, the limit and the line carried to it', () => {
    const svg = trendChart({
      title: 'F1 crack',
      points,
      limit: 1.6,
      fit: { intercept: 0, slopePerCycle: 0.001 },
      unit: 'mm',
    });
    const circles = svg.children.filter((child) => child.tag === 'circle');
    expect(circles).toHaveLength(3);
    // Points rise left to right: a larger value is drawn higher (smaller y).
    const ys = circles.map((circle) => Number(circle.attrs.cy));
    expect(ys[0]).toBeGreaterThan(ys[1]!);
    expect(ys[1]).toBeGreaterThan(ys[2]!);
    // The line meets the limit at CSN 1,600 (within one more span): it ends on the limit line.
    const lines = svg.children.filter((child) => child.tag === 'line');
    const limit = lines.find((line) => line.attrs['stroke-dasharray'] === '6 4')!;
    const fit = lines.find((line) => line.attrs.stroke === '#666')!;
    expect(fit.attrs.y2).toBe(limit.attrs.y1);
    expect(renderSvg(svg)).toContain('limit 1.6 mm');
  });

  it('draws no line where there is no fit, and stops at the last point when the limit is far', () => {
    const none = trendChart({ title: 't', points, limit: 2, fit: null, unit: 'mm' });
    expect(none.children.some((child) => child.attrs.stroke === '#666')).toBe(false);
    const far = trendChart({
      title: 't',
      points,
      limit: 100,
      fit: { intercept: 0, slopePerCycle: 0.001 },
      unit: 'mm',
    });
    const fit = far.children.find((child) => child.attrs.stroke === '#666')!;
    const last = far.children.filter((child) => child.tag === 'circle').at(-1)!;
    expect(fit.attrs.x2).toBe(last.attrs.cx);
  });
});
