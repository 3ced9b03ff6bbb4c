import type { Category } from '@emberline/contracts/limits';
import { el, n, text, title, type SvgNode } from './svg';
import { glyph, unmarkedStyle, unviewedStyle, verdictStyles } from './verdict-style';

/**
 * The clock position of position 1, read from a row's numbering convention ("12 o'clock (top dead
 * centre)", "3 o'clock", "bottom dead centre"). Twelve when the words give no clock position.
 */
export function clockOfPositionOne(words: string): number {
  const clock = /\b(\d{1,2})(?::(\d{2}))?\s*o['’]?\s*clock/i.exec(words);
  if (clock) {
    const hours = Number(clock[1]) % 12 || 12;
    return hours + Number(clock[2] ?? 0) / 60;
  }
  if (/bottom dead cent/i.test(words)) return 6;
  return 12;
}

export interface StageRingInput {
  /** Positions 1..count around the circle; count is next to 1. */
  count: number;
  /** Where position 1 sits, as a clock position in the view drawn (12 = top, 3 = right). */
  positionOneClock: number;
  direction: 'clockwise' | 'counter-clockwise';
  /** Words for the view drawn, such as "aft looking forward". */
  viewpoint: string;
  title: string;
  /** The worst verdict at each position that has findings. */
  verdicts: ReadonlyMap<number, Category>;
  /** Positions not viewed in this inspection (drawn as such); empty when the row was fully viewed. */
  unviewed?: ReadonlySet<number>;
  selected?: number | null;
  size?: number;
}

export interface RingSector {
  position: number;
  /** Degrees clockwise from 12 o'clock, in the view drawn. */
  startAngle: number;
  midAngle: number;
  endAngle: number;
  path: string;
  /** Where the position's glyph (or number) sits, just outside the ring. */
  markPoint: [number, number];
  labelPoint: [number, number];
  category: Category | null;
  unviewed: boolean;
}

export interface RingGeometry {
  size: number;
  centre: [number, number];
  inner: number;
  outer: number;
  sectors: RingSector[];
}

/** A point at `radius` from the centre, `angle` degrees clockwise from 12 o'clock. */
export function polar(centre: [number, number], radius: number, angle: number): [number, number] {
  const radians = (angle * Math.PI) / 180;
  return [centre[0] + radius * Math.sin(radians), centre[1] - radius * Math.cos(radians)];
}

/**
 * The ring's sectors: position p is centred at θ₁ ± (p − 1)·360°/N, θ₁ = 30° per clock hour,
 * plus for clockwise counting and minus for counter-clockwise, in the view drawn.
 */
export function stageRingGeometry(input: StageRingInput): RingGeometry {
  const size = input.size ?? 360;
  const centre: [number, number] = [size / 2, size / 2 + 12];
  const outer = size * 0.34;
  const inner = outer * 0.68;
  const step = 360 / input.count;
  const first = (input.positionOneClock % 12) * 30;
  const sign = input.direction === 'clockwise' ? 1 : -1;
  const sectors = Array.from({ length: input.count }, (_, index): RingSector => {
    const position = index + 1;
    const mid = (((first + sign * index * step) % 360) + 360) % 360;
    const start = mid - step / 2;
    const end = mid + step / 2;
    const [ax, ay] = polar(centre, outer, start);
    const [bx, by] = polar(centre, outer, end);
    const [cx, cy] = polar(centre, inner, end);
    const [dx, dy] = polar(centre, inner, start);
    const large = step > 180 ? 1 : 0;
    return {
      position,
      startAngle: start,
      midAngle: mid,
      endAngle: end,
      path: `M ${n(ax)} ${n(ay)} A ${n(outer)} ${n(outer)} 0 ${large} 1 ${n(bx)} ${n(by)} L ${n(cx)} ${n(cy)} A ${n(inner)} ${n(inner)} 0 ${large} 0 ${n(dx)} ${n(dy)} Z`,
      markPoint: polar(centre, outer + size * 0.035, mid),
      labelPoint: polar(centre, outer + size * 0.085, mid),
      category: input.verdicts.get(position) ?? null,
      unviewed: input.unviewed?.has(position) ?? false,
    };
  });
  return { size, centre, inner, outer, sectors };
}

/** Which positions get their number written: 1, every tenth (fifth on short rows), and marked ones. */
function labelled(sector: RingSector, count: number): boolean {
  const every = count > 40 ? 10 : 5;
  return sector.position === 1 || sector.position % every === 0 || sector.category !== null;
}

/**
 * The stage ring: a row's positions around a circle, each filled and marked by its worst verdict,
 * with position 1, the counting direction and the viewpoint written out, and a legend.
 */
export function stageRing(input: StageRingInput): SvgNode {
  const geometry = stageRingGeometry(input);
  const { size, centre, inner } = geometry;
  const font = n(size * 0.03);
  const sectors = geometry.sectors.map((sector) => {
    const style = sector.category ? verdictStyles[sector.category] : null;
    const fill = style?.fill ?? (sector.unviewed ? unviewedStyle.fill : unmarkedStyle.fill);
    const selected = input.selected === sector.position;
    const state = style?.label ?? (sector.unviewed ? unviewedStyle.label : 'No finding');
    return el(
      'g',
      {
        'data-position': sector.position,
        'data-category': sector.category ?? 'none',
        class: 'ring-sector',
      },
      [
        title(`Position ${sector.position}: ${state}`),
        el('path', {
          d: sector.path,
          fill,
          stroke: selected ? '#1d1a16' : (style?.stroke ?? unmarkedStyle.stroke),
          'stroke-width': selected ? 2.5 : 0.75,
          'stroke-dasharray': sector.unviewed && !style ? '2 2' : undefined,
        }),
        sector.category ? glyph(sector.category, ...sector.markPoint, size * 0.032) : null,
        labelled(sector, input.count)
          ? text(
              {
                x: n(sector.labelPoint[0]),
                y: n(sector.labelPoint[1]),
                'font-size': font,
                'text-anchor': 'middle',
                'dominant-baseline': 'central',
                'font-family': 'system-ui, sans-serif',
                fill: '#2b2620',
                'font-weight': sector.position === 1 ? 700 : 400,
              },
              String(sector.position),
            )
          : null,
      ],
    );
  });

  const one = geometry.sectors[0]!;
  const arrowStart = one.midAngle + (input.direction === 'clockwise' ? 4 : -4);
  const arrowEnd = one.midAngle + (input.direction === 'clockwise' ? 34 : -34);
  const arrowRadius = inner - size * 0.05;
  const [sx, sy] = polar(centre, arrowRadius, arrowStart);
  const [ex, ey] = polar(centre, arrowRadius, arrowEnd);
  const sweep = input.direction === 'clockwise' ? 1 : 0;
  const [hx, hy] = polar(centre, arrowRadius, arrowEnd);
  const head = (offset: number, radius: number) =>
    polar(centre, radius, arrowEnd - (input.direction === 'clockwise' ? offset : -offset));

  const legendItems: { category: Category | null; label: string }[] = [
    ...(['serviceable', 'repeat-inspection', 'review', 'beyond-limits'] as const).map(
      (category) => ({
        category,
        label: verdictStyles[category].label,
      }),
    ),
    ...(input.unviewed && input.unviewed.size > 0
      ? [{ category: null, label: unviewedStyle.label }]
      : []),
  ];
  const legendTop = size + 24;
  const legend = el(
    'g',
    { class: 'ring-legend' },
    legendItems.map((item, index) => {
      const x = 16 + (index % 2) * (size / 2);
      const y = legendTop + Math.floor(index / 2) * (font * 1.9);
      return el('g', {}, [
        item.category
          ? glyph(item.category, x + font / 2, y, font * 1.1)
          : el('rect', {
              x: n(x),
              y: n(y - font / 2),
              width: font,
              height: font,
              fill: unviewedStyle.fill,
              stroke: unviewedStyle.stroke,
              'stroke-dasharray': '2 2',
            }),
        text(
          {
            x: n(x + font * 1.6),
            y: n(y),
            'font-size': font,
            'dominant-baseline': 'central',
            'font-family': 'system-ui, sans-serif',
            fill: '#2b2620',
          },
          item.label,
        ),
      ]);
    }),
  );
  const legendRows = Math.ceil(legendItems.length / 2);
  const height = legendTop + legendRows * font * 1.9 + 8;

  return el(
    'svg',
    {
      viewBox: `0 0 ${n(size)} ${n(height)}`,
      width: n(size),
      height: n(height),
      role: 'img',
      'aria-label': `${input.title}: ${input.count} positions, position 1 at ${formatClock(input.positionOneClock)}, counted ${input.direction}, seen ${input.viewpoint}`,
    },
    [
      text(
        {
          x: n(size / 2),
          y: n(font * 1.2),
          'font-size': n(font * 1.15),
          'text-anchor': 'middle',
          'font-family': 'system-ui, sans-serif',
          'font-weight': 700,
          fill: '#2b2620',
        },
        input.title,
      ),
      text(
        {
          x: n(size / 2),
          y: n(font * 2.5),
          'font-size': n(font * 0.9),
          'text-anchor': 'middle',
          'font-family': 'system-ui, sans-serif',
          fill: '#5a5247',
        },
        `Seen ${input.viewpoint} · counted ${input.direction}`,
      ),
      el('g', { class: 'ring-sectors' }, sectors),
      el('path', {
        d: `M ${n(sx)} ${n(sy)} A ${n(arrowRadius)} ${n(arrowRadius)} 0 0 ${sweep} ${n(ex)} ${n(ey)}`,
        fill: 'none',
        stroke: '#5a5247',
        'stroke-width': 1.5,
        class: 'ring-direction',
      }),
      el('polygon', {
        points: [[hx, hy], head(7, arrowRadius + 5), head(7, arrowRadius - 5)]
          .map(([x, y]) => `${n(x!)},${n(y!)}`)
          .join(' '),
        fill: '#5a5247',
      }),
      text(
        {
          x: n(centre[0]),
          y: n(centre[1]),
          'font-size': font,
          'text-anchor': 'middle',
          'dominant-baseline': 'central',
          'font-family': 'system-ui, sans-serif',
          fill: '#5a5247',
        },
        `${input.count} positions`,
      ),
      legend,
    ],
  );
}

function formatClock(clock: number): string {
  const hours = Math.floor(clock);
  const minutes = Math.round((clock - hours) * 60);
  return `${hours}${minutes ? `:${String(minutes).padStart(2, '0')}` : ''} o'clock`;
}
