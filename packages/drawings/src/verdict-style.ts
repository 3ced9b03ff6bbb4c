import type { Category } from '@emberline/contracts/limits';
import { el, n, type SvgNode } from './svg';

/**
 * Emberline's own marks for the four verdicts: each has a colour, a glyph shape and a word, so
 * that a drawing stays readable in grey print or for a reader who does not tell the colours apart.
 */
export interface VerdictStyle {
  label: string;
  fill: string;
  stroke: string;
  /** Dash pattern of outlines drawn in this verdict ('' for solid). */
  dash: string;
  glyph: 'ring' | 'triangle' | 'diamond' | 'square-cross';
}

export const verdictStyles: Record<Category, VerdictStyle> = {
  serviceable: {
    label: 'Serviceable',
    fill: '#cfe0c3',
    stroke: '#3f6b35',
    dash: '',
    glyph: 'ring',
  },
  'repeat-inspection': {
    label: 'Repeat inspection',
    fill: '#f2d38b',
    stroke: '#8a5a00',
    dash: '8 4',
    glyph: 'triangle',
  },
  review: {
    label: 'Review',
    fill: '#c9d0ea',
    stroke: '#34427a',
    dash: '2 3',
    glyph: 'diamond',
  },
  'beyond-limits': {
    label: 'Beyond limits',
    fill: '#e8a39a',
    stroke: '#8f1d12',
    dash: '',
    glyph: 'square-cross',
  },
};

export const unmarkedStyle = { fill: '#f4f1ea', stroke: '#8a8170' };
export const unviewedStyle = { fill: '#d8d4cc', stroke: '#8a8170', label: 'Not viewed' };

/** The verdict's glyph centred on (x, y), `size` across. */
export function glyph(category: Category, x: number, y: number, size: number): SvgNode {
  const style = verdictStyles[category];
  const r = size / 2;
  const paint = { fill: style.fill, stroke: style.stroke, 'stroke-width': n(size / 8) };
  switch (style.glyph) {
    case 'ring':
      return el('circle', { cx: n(x), cy: n(y), r: n(r * 0.8), ...paint });
    case 'triangle':
      return el('polygon', {
        points: [
          [x, y - r],
          [x + r * 0.95, y + r * 0.75],
          [x - r * 0.95, y + r * 0.75],
        ]
          .map(([px, py]) => `${n(px!)},${n(py!)}`)
          .join(' '),
        ...paint,
      });
    case 'diamond':
      return el('polygon', {
        points: [
          [x, y - r],
          [x + r, y],
          [x, y + r],
          [x - r, y],
        ]
          .map(([px, py]) => `${n(px!)},${n(py!)}`)
          .join(' '),
        ...paint,
      });
    case 'square-cross':
      return el('g', {}, [
        el('rect', {
          x: n(x - r * 0.85),
          y: n(y - r * 0.85),
          width: n(r * 1.7),
          height: n(r * 1.7),
          ...paint,
        }),
        el('path', {
          d: `M ${n(x - r * 0.55)} ${n(y - r * 0.55)} L ${n(x + r * 0.55)} ${n(y + r * 0.55)} M ${n(x + r * 0.55)} ${n(y - r * 0.55)} L ${n(x - r * 0.55)} ${n(y + r * 0.55)}`,
          stroke: style.stroke,
          'stroke-width': n(size / 7),
          fill: 'none',
        }),
      ]);
  }
}
