// Invented borescope-like stills: a dim, vignetted view of curved airfoils under a probe light,
// with marks such as a crack line, a burnt patch or lost coating, and a drawn reference gauge to
// calibrate on. No real photograph is used.

type Point = [number, number];

export type DemoMark =
  | { kind: 'crack'; points: Point[] }
  | { kind: 'burn'; centre: Point; rx: number; ry: number }
  | { kind: 'coating-loss'; outline: Point[] }
  | { kind: 'erosion'; points: Point[] };

export type DemoMarkKind = DemoMark['kind'] | 'none';

/** The reference gauge drawn on every still: two marks 400 px apart that stand for 4 mm. */
export const demoReference = {
  kind: 'reference' as const,
  p1: [120, 1100] as Point,
  p2: [520, 1100] as Point,
  lengthMm: 4,
};

function random(seed: number): () => number {
  let state = seed >>> 0 || 1;
  return () => {
    state = (state * 1664525 + 1013904223) >>> 0;
    return state / 2 ** 32;
  };
}

/** The outline of an elliptical patch as a polygon of `sides` points: what a finding traces. */
export function ellipseOutline(centre: Point, rx: number, ry: number, sides = 16): Point[] {
  return Array.from({ length: sides }, (_, index) => {
    const angle = (2 * Math.PI * index) / sides;
    return [
      Math.round((centre[0] + rx * Math.cos(angle)) * 10) / 10,
      Math.round((centre[1] + ry * Math.sin(angle)) * 10) / 10,
    ];
  });
}

/** A crack of roughly `lengthPx` pixels from `start`, running down and to the right in `segments` steps. */
export function crackPoints(start: Point, lengthPx: number, segments = 4, seed = 1): Point[] {
  const next = random(seed);
  const points: Point[] = [start];
  const step = lengthPx / segments;
  for (let index = 0; index < segments; index += 1) {
    const angle = Math.PI / 3 + (next() - 0.5) * 0.5;
    const [x, y] = points[index]!;
    points.push([
      Math.round((x + step * Math.cos(angle)) * 10) / 10,
      Math.round((y + step * Math.sin(angle)) * 10) / 10,
    ]);
  }
  return points;
}

/** Marks at random places, for stills that only need to look the part. */
export function randomMarks(
  seed: number,
  kinds: DemoMarkKind[],
  width = 1600,
  height = 1200,
): DemoMark[] {
  const next = random(seed * 7 + 3);
  const cx = width * (0.35 + next() * 0.3);
  const cy = height * (0.3 + next() * 0.3);
  return kinds.flatMap((kind): DemoMark[] => {
    if (kind === 'crack')
      return [{ kind, points: crackPoints([cx, cy], 160 + next() * 60, 8, seed) }];
    if (kind === 'burn')
      return [{ kind, centre: [cx + 160, cy - 120], rx: 100 + next() * 50, ry: 70 + next() * 40 }];
    if (kind === 'coating-loss')
      return [{ kind, outline: ellipseOutline([cx - 130, cy + 170], 90, 55, 10) }];
    if (kind === 'erosion')
      return [
        {
          kind,
          points: [
            [cx - 60, cy],
            [cx + 60, cy + 20],
          ],
        },
      ];
    return [];
  });
}

const join = (points: Point[]) => points.map(([x, y]) => `${x},${y}`).join(' ');

/** A ragged edge around an outline: cheap to render, unlike an SVG turbulence filter. */
function ragged(points: Point[], seed: number, amount: number): Point[] {
  const next = random(seed);
  const out: Point[] = [];
  points.forEach((point, index) => {
    const following = points[(index + 1) % points.length]!;
    for (let step = 0; step < 3; step += 1) {
      const t = step / 3;
      out.push([
        Math.round(point[0] + (following[0] - point[0]) * t + (next() - 0.5) * amount),
        Math.round(point[1] + (following[1] - point[1]) * t + (next() - 0.5) * amount),
      ]);
    }
  });
  return out;
}

function drawMark(mark: DemoMark, seed: number): string {
  switch (mark.kind) {
    case 'crack':
      return `<polyline points="${join(mark.points)}" fill="none" stroke="#120a06" stroke-width="5" stroke-linejoin="round" stroke-linecap="round"/>`;
    case 'burn':
      return `<polygon points="${join(ragged(ellipseOutline(mark.centre, mark.rx * 1.1, mark.ry * 1.1, 20), seed, 24))}" fill="url(#burn)"/>`;
    case 'coating-loss':
      return `<polygon points="${join(ragged(mark.outline, seed, 18))}" fill="#d9c3a0" opacity="0.75"/>`;
    case 'erosion':
      return `<polyline points="${join(mark.points)}" fill="none" stroke="#e6cfa8" stroke-width="14" stroke-linecap="round" opacity="0.6"/>`;
  }
}

/** An SVG still of the given size; the same seed and marks always draw the same picture. */
export function borescopeScene(
  seed: number,
  marks: DemoMark[],
  width = 1600,
  height = 1200,
): string {
  const next = random(seed);
  const airfoils = Array.from({ length: 5 }, (_, index) => {
    const x = width * (0.05 + index * 0.22 + next() * 0.04);
    const bend = width * (0.08 + next() * 0.05);
    const thickness = width * (0.07 + next() * 0.02);
    return `<path d="M ${x} ${-50} C ${x + bend} ${height * 0.3}, ${x + bend} ${height * 0.7}, ${x} ${height + 50} L ${x + thickness} ${height + 50} C ${x + thickness + bend * 0.8} ${height * 0.7}, ${x + thickness + bend * 0.8} ${height * 0.3}, ${x + thickness} ${-50} Z" fill="url(#metal)" stroke="#2a1a10" stroke-width="6"/>`;
  }).join('');
  const [r1, r2] = [demoReference.p1, demoReference.p2];
  const gauge = `<g>
    <line x1="${r1[0]}" y1="${r1[1]}" x2="${r2[0]}" y2="${r2[1]}" stroke="#e8e0d0" stroke-width="4"/>
    ${Array.from({ length: 5 }, (_, index) => {
      const x = r1[0] + ((r2[0] - r1[0]) * index) / 4;
      return `<line x1="${x}" y1="${r1[1] - (index % 4 === 0 ? 22 : 12)}" x2="${x}" y2="${r1[1] + (index % 4 === 0 ? 22 : 12)}" stroke="#e8e0d0" stroke-width="4"/>`;
    }).join('')}
    <text x="${(r1[0] + r2[0]) / 2}" y="${r1[1] - 34}" font-family="sans-serif" font-size="26" fill="#e8e0d0" text-anchor="middle">4 mm reference (demo)</text>
  </g>`;
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}">
  <defs>
    <linearGradient id="metal" x1="0" x2="1"><stop offset="0" stop-color="#5c3b22"/><stop offset="0.45" stop-color="#b07a46"/><stop offset="1" stop-color="#3b2414"/></linearGradient>
    <radialGradient id="burn"><stop offset="0" stop-color="#1b0f08"/><stop offset="0.6" stop-color="#4a2410"/><stop offset="1" stop-color="#8a4a1c" stop-opacity="0"/></radialGradient>
    <radialGradient id="vignette" cx="0.5" cy="0.5" r="0.7"><stop offset="0.35" stop-color="#000" stop-opacity="0"/><stop offset="1" stop-color="#000" stop-opacity="0.92"/></radialGradient>
  </defs>
  <rect width="100%" height="100%" fill="#1a0f08"/>
  ${airfoils}
  ${marks.map((mark) => drawMark(mark, seed)).join('')}
  <rect width="100%" height="100%" fill="url(#vignette)"/>
  ${gauge}
  <text x="${width - 30}" y="${height - 30}" font-family="sans-serif" font-size="28" fill="#9c8f80" text-anchor="end">DEMO · INVENTED IMAGE</text>
</svg>`;
}
