import type { Category } from '@emberline/contracts/limits';
import type { Calibration, ImagePoint, ShapeKind } from '@emberline/contracts/measurement';
import { el, n, text, title, type SvgNode } from './svg';
import { glyph, verdictStyles } from './verdict-style';

export interface OverlayShape {
  id: string;
  /** Short label drawn beside the shape, such as "F3". */
  label: string;
  /** A second line, such as the measurement ("1.25 mm"). */
  detail?: string;
  kind: ShapeKind;
  points: readonly ImagePoint[];
  category: Category | null;
  selected?: boolean;
}

export interface OverlayInput {
  /** The image's pixel size as displayed: the overlay's coordinate frame. */
  width: number;
  height: number;
  shapes: readonly OverlayShape[];
  calibration?: Calibration | null;
}

/** Line width and text size in image pixels, so that they read the same on any image size. */
export function overlayScale(width: number, height: number) {
  const base = Math.max(width, height) / 1600;
  return {
    stroke: Math.max(1.5, 3 * base),
    font: Math.max(12, 26 * base),
    vertex: Math.max(3, 6 * base),
  };
}

/**
 * Where a shape's label goes: above its highest point, moved inside the image so that a label of
 * a shape near an edge stays readable.
 */
export function labelAnchor(
  points: readonly ImagePoint[],
  width: number,
  height: number,
  font: number,
  halfWidth = font * 2,
): [number, number] {
  const top = points.reduce((best, point) => (point[1] < best[1] ? point : best), points[0]!);
  const margin = font * 0.5;
  const x = Math.min(Math.max(top[0], margin + halfWidth), width - margin - halfWidth);
  const above = top[1] - font * 0.9;
  const y = above - font < 0 ? Math.min(top[1] + font * 1.6, height - margin) : above;
  return [x, y];
}

const join = (points: readonly ImagePoint[]) => points.map(([x, y]) => `${n(x)},${n(y)}`).join(' ');

function shapeNode(shape: OverlayShape, scale: ReturnType<typeof overlayScale>): SvgNode {
  const style = shape.category ? verdictStyles[shape.category] : null;
  const stroke = style?.stroke ?? '#f2e6cf';
  const width = shape.selected ? scale.stroke * 1.8 : scale.stroke;
  const outline = {
    stroke,
    'stroke-width': n(width),
    'stroke-dasharray': style?.dash
      ? style.dash
          .split(' ')
          .map((part) => n(Number(part) * scale.stroke))
          .join(' ')
      : undefined,
    'stroke-linejoin': 'round',
    'stroke-linecap': 'round',
  };
  // A dark halo under every line keeps it visible on bright metal and on dark soot alike.
  const halo = {
    stroke: '#120c08',
    'stroke-width': n(width + scale.stroke * 1.4),
    'stroke-linejoin': 'round',
    'stroke-linecap': 'round',
    opacity: 0.7,
  };
  if (shape.kind === 'point') {
    const [x, y] = shape.points[0]!;
    const r = scale.vertex * 2.2;
    const cross = `M ${n(x - r)} ${n(y)} L ${n(x + r)} ${n(y)} M ${n(x)} ${n(y - r)} L ${n(x)} ${n(y + r)}`;
    return el('g', {}, [
      el('path', { d: cross, fill: 'none', ...halo }),
      el('circle', { cx: n(x), cy: n(y), r: n(r * 0.6), fill: 'none', ...halo }),
      el('path', { d: cross, fill: 'none', ...outline, 'stroke-dasharray': undefined }),
      el('circle', {
        cx: n(x),
        cy: n(y),
        r: n(r * 0.6),
        fill: 'none',
        ...outline,
        'stroke-dasharray': undefined,
      }),
    ]);
  }
  const tag = shape.kind === 'polygon' ? 'polygon' : 'polyline';
  const points = join(shape.points);
  return el('g', {}, [
    el(tag, { points, fill: 'none', ...halo }),
    el(tag, {
      points,
      fill: shape.kind === 'polygon' && style ? style.fill : 'none',
      'fill-opacity': shape.kind === 'polygon' ? 0.28 : undefined,
      ...outline,
    }),
    ...(shape.selected
      ? shape.points.map(([x, y]) =>
          el('circle', {
            cx: n(x),
            cy: n(y),
            r: n(scale.vertex),
            fill: '#fffaf0',
            stroke: '#120c08',
            'stroke-width': n(scale.stroke / 2),
          }),
        )
      : []),
  ]);
}

/** About how wide a line of text is drawn in a sans-serif face (0.56 of the size per character). */
const textWidth = (words: string, font: number) => words.length * font * 0.56;

/**
 * A shape's label: its name, then the verdict as the stage ring shows it (glyph and word, never
 * an abbreviation), and the measured detail on a line of its own.
 */
function labelNode(shape: OverlayShape, input: OverlayInput, font: number): SvgNode {
  const style = shape.category ? verdictStyles[shape.category] : null;
  const words = style ? `${shape.label} · ${style.label}` : shape.label;
  const glyphRoom = style ? font * 1.15 : 0;
  const width = glyphRoom + textWidth(words, font);
  const [x, y] = labelAnchor(shape.points, input.width, input.height, font, width / 2);
  const paint = {
    'font-family': 'system-ui, sans-serif',
    fill: '#fffaf0',
    stroke: '#120c08',
    'stroke-width': n(font / 5),
    'paint-order': 'stroke',
  };
  // Above the shape the detail line sits nearest to it; below (at the image's top edge), under the name.
  const top = Math.min(...shape.points.map((point) => point[1]));
  const above = y < top;
  const nameY = shape.detail && above ? y - font * 1.05 : y;
  const detailY = above ? y : y + font * 1.05;
  const left = x - width / 2;
  return el('g', { class: 'overlay-label' }, [
    shape.category
      ? glyph(shape.category, left + font * 0.45, nameY - font * 0.35, font * 0.9)
      : null,
    text(
      {
        x: n(left + glyphRoom),
        y: n(nameY),
        'font-size': n(font),
        'font-weight': 700,
        'text-anchor': 'start',
        ...paint,
      },
      words,
    ),
    shape.detail
      ? text(
          { x: n(x), y: n(detailY), 'font-size': n(font * 0.8), 'text-anchor': 'middle', ...paint },
          shape.detail,
        )
      : null,
  ]);
}

function calibrationNode(
  calibration: Calibration,
  scale: ReturnType<typeof overlayScale>,
): SvgNode {
  const line = {
    stroke: '#7fd1c7',
    'stroke-width': n(scale.stroke),
    fill: 'none',
    'stroke-dasharray': `${n(scale.stroke * 4)} ${n(scale.stroke * 2)}`,
  };
  if (calibration.kind === 'reference') {
    const [[x1, y1], [x2, y2]] = [calibration.p1, calibration.p2];
    const ticks = [calibration.p1, calibration.p2].map(([x, y]) =>
      el('circle', {
        cx: n(x),
        cy: n(y),
        r: n(scale.vertex),
        fill: '#7fd1c7',
        stroke: '#120c08',
        'stroke-width': n(scale.stroke / 2),
      }),
    );
    return el('g', { class: 'overlay-calibration' }, [
      title(`Reference: ${calibration.lengthMm} mm`),
      el('line', { x1: n(x1), y1: n(y1), x2: n(x2), y2: n(y2), ...line }),
      ...ticks,
      text(
        {
          x: n((x1 + x2) / 2),
          y: n((y1 + y2) / 2 - scale.font * 0.6),
          'font-size': n(scale.font * 0.8),
          'text-anchor': 'middle',
          fill: '#7fd1c7',
          stroke: '#120c08',
          'stroke-width': n(scale.font / 6),
          'paint-order': 'stroke',
          'font-family': 'system-ui, sans-serif',
        },
        `${calibration.lengthMm} mm`,
      ),
    ]);
  }
  return el('g', { class: 'overlay-calibration' }, [
    title(`Plane: ${calibration.widthMm} × ${calibration.heightMm} mm`),
    el('polygon', { points: join(calibration.corners), ...line }),
    ...calibration.corners.map(([x, y], index) =>
      text(
        {
          x: n(x),
          y: n(y - scale.vertex * 1.6),
          'font-size': n(scale.font * 0.7),
          'text-anchor': 'middle',
          fill: '#7fd1c7',
          stroke: '#120c08',
          'stroke-width': n(scale.font / 6),
          'paint-order': 'stroke',
          'font-family': 'system-ui, sans-serif',
        },
        String(index + 1),
      ),
    ),
  ]);
}

/**
 * The annotation overlay in the image's own pixel frame (viewBox = the image size): each shape in
 * its verdict's outline and dash, with its label and verdict word, and the calibration used.
 */
export function annotationOverlay(input: OverlayInput): SvgNode {
  const scale = overlayScale(input.width, input.height);
  return el(
    'svg',
    {
      viewBox: `0 0 ${input.width} ${input.height}`,
      width: input.width,
      height: input.height,
      class: 'annotation-overlay',
    },
    [
      input.calibration ? calibrationNode(input.calibration, scale) : null,
      ...input.shapes.map((shape) =>
        el('g', { 'data-shape': shape.id, class: 'overlay-shape' }, [
          title(
            `${shape.label}${shape.category ? `: ${verdictStyles[shape.category].label}` : ''}${shape.detail ? `, ${shape.detail}` : ''}`,
          ),
          shapeNode(shape, scale),
          labelNode(shape, input, scale.font),
        ]),
      ),
    ],
  );
}
