import { el, n, text, title, type SvgNode } from './svg';

export interface TrendChartInput {
  title: string;
  /** The measurements, in the unit named: value and its uncertainty at each CSN. */
  points: readonly { csn: number; value: number; uncertainty: number }[];
  /** The outer limit the series is judged against, in the same unit. */
  limit: number;
  /** The least-squares line (value = intercept + slope·csn), or null with fewer than two CSN. */
  fit: { intercept: number; slopePerCycle: number } | null;
  unit: string;
  width?: number;
  height?: number;
}

/** Round ticks: 1, 2 or 5 times a power of ten, about `count` of them over [min, max]. */
function ticks(min: number, max: number, count: number): number[] {
  const span = max - min || 1;
  const raw = span / count;
  const power = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * power).find((candidate) => candidate >= raw)!;
  const first = Math.ceil(min / step) * step;
  const values: number[] = [];
  for (let value = first; value <= max + step * 1e-9; value += step) values.push(value);
  return values;
}

/**
 * A damage series drawn against CSN: each measurement with its uncertainty bar, the straight
 * line through them carried on to where it meets the limit (when that is near), and the limit as
 * a dashed line. Black and grey only, so that it prints as it shows.
 */
export function trendChart(input: TrendChartInput): SvgNode {
  const width = input.width ?? 480;
  const height = input.height ?? 220;
  const left = 56;
  const right = 14;
  const top = 14;
  const bottom = 36;
  const csns = input.points.map((point) => point.csn);
  const first = Math.min(...csns);
  const last = Math.max(...csns);
  const span = Math.max(last - first, 1);
  // Carried on to the limit when the line meets it within another span of the series.
  const meets =
    input.fit && input.fit.slopePerCycle > 0
      ? (input.limit - input.fit.intercept) / input.fit.slopePerCycle
      : null;
  const end = meets !== null && meets > last && meets <= last + span ? meets : last;
  const xMin = first - span * 0.05;
  const xMax = end + span * 0.05;
  const yMax =
    Math.max(input.limit, ...input.points.map((point) => point.value + point.uncertainty)) * 1.12;
  const x = (csn: number) => n(left + ((csn - xMin) / (xMax - xMin)) * (width - left - right));
  const y = (value: number) => n(top + (1 - value / yMax) * (height - top - bottom));
  const axis = { stroke: '#333', 'stroke-width': 1 };
  const small = { 'font-size': 10, 'font-family': 'Roboto, sans-serif', fill: '#333' };

  return el('svg', { width, height, viewBox: `0 0 ${width} ${height}`, role: 'img' }, [
    title(input.title),
    el('rect', { x: 0, y: 0, width, height, fill: '#fff' }),
    ...ticks(0, yMax, 4).flatMap((value) => [
      el('line', { x1: left, x2: width - right, y1: y(value), y2: y(value), stroke: '#e3e3e3' }),
      text({ x: left - 6, y: y(value) + 3, 'text-anchor': 'end', ...small }, `${n(value)}`),
    ]),
    ...ticks(xMin, xMax, 4).map((csn) =>
      text(
        { x: x(csn), y: height - bottom + 14, 'text-anchor': 'middle', ...small },
        csn.toLocaleString('en-GB'),
      ),
    ),
    text(
      { x: (left + width - right) / 2, y: height - 6, 'text-anchor': 'middle', ...small },
      'CSN',
    ),
    text(
      {
        x: 12,
        y: (top + height - bottom) / 2,
        transform: `rotate(-90 12 ${(top + height - bottom) / 2})`,
        'text-anchor': 'middle',
        ...small,
      },
      input.unit,
    ),
    el('line', { x1: left, x2: left, y1: top, y2: height - bottom, ...axis }),
    el('line', { x1: left, x2: width - right, y1: height - bottom, y2: height - bottom, ...axis }),
    el('line', {
      x1: left,
      x2: width - right,
      y1: y(input.limit),
      y2: y(input.limit),
      stroke: '#000',
      'stroke-width': 1.2,
      'stroke-dasharray': '6 4',
    }),
    text(
      { x: width - right - 2, y: y(input.limit) - 4, 'text-anchor': 'end', ...small },
      `limit ${n(input.limit)} ${input.unit}`,
    ),
    input.fit
      ? el('line', {
          x1: x(first),
          x2: x(end),
          y1: y(input.fit.intercept + input.fit.slopePerCycle * first),
          y2: y(input.fit.intercept + input.fit.slopePerCycle * end),
          stroke: '#666',
          'stroke-width': 1.2,
        })
      : null,
    ...input.points.flatMap((point) => [
      el('line', {
        x1: x(point.csn),
        x2: x(point.csn),
        y1: y(point.value + point.uncertainty),
        y2: y(Math.max(0, point.value - point.uncertainty)),
        stroke: '#000',
      }),
      el('circle', { cx: x(point.csn), cy: y(point.value), r: 3.5, fill: '#000' }),
    ]),
  ]);
}
