// Invented borescope-like stills: a dim, vignetted view of curved airfoils under a probe light,
// with marks such as a crack line, a burnt patch or lost coating. No real photograph is used.

export type DemoMark = 'crack' | 'burn' | 'coating-loss' | 'none';

function random(seed: number): () => number {
  let state = seed >>> 0 || 1;
  return () => {
    state = (state * 1664525 + 1013904223) >>> 0;
    return state / 2 ** 32;
  };
}

/** An SVG still of the given size; the same seed always draws the same picture. */
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
  const cx = width * (0.35 + next() * 0.3);
  const cy = height * (0.35 + next() * 0.3);
  const drawn = marks
    .map((mark) => {
      if (mark === 'crack') {
        const points = Array.from(
          { length: 9 },
          (_, index) => `${cx + index * 18 + next() * 10},${cy + index * 22 + (next() - 0.5) * 26}`,
        ).join(' ');
        return `<polyline points="${points}" fill="none" stroke="#120a06" stroke-width="5" stroke-linejoin="round"/>`;
      }
      if (mark === 'burn') {
        const r = 70 + next() * 40;
        return `<ellipse cx="${cx + 160}" cy="${cy - 120}" rx="${r * 1.4}" ry="${r}" fill="url(#burn)" filter="url(#rough)"/>`;
      }
      if (mark === 'coating-loss') {
        return `<path d="M ${cx - 200} ${cy + 150} q 60 -50 140 -10 q 50 40 20 100 q -70 40 -150 10 z" fill="#d9c3a0" opacity="0.75" filter="url(#rough)"/>`;
      }
      return '';
    })
    .join('');
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}">
  <defs>
    <linearGradient id="metal" x1="0" x2="1"><stop offset="0" stop-color="#5c3b22"/><stop offset="0.45" stop-color="#b07a46"/><stop offset="1" stop-color="#3b2414"/></linearGradient>
    <radialGradient id="burn"><stop offset="0" stop-color="#1b0f08"/><stop offset="0.6" stop-color="#4a2410"/><stop offset="1" stop-color="#8a4a1c" stop-opacity="0"/></radialGradient>
    <radialGradient id="vignette" cx="0.5" cy="0.5" r="0.7"><stop offset="0.35" stop-color="#000" stop-opacity="0"/><stop offset="1" stop-color="#000" stop-opacity="0.92"/></radialGradient>
    <filter id="rough"><feTurbulence type="fractalNoise" baseFrequency="0.04" numOctaves="3" seed="${seed % 97}"/><feDisplacementMap in="SourceGraphic" scale="30"/></filter>
  </defs>
  <rect width="100%" height="100%" fill="#1a0f08"/>
  ${airfoils}
  ${drawn}
  <rect width="100%" height="100%" fill="url(#vignette)"/>
  <text x="${width - 30}" y="${height - 30}" font-family="sans-serif" font-size="28" fill="#9c8f80" text-anchor="end">DEMO · INVENTED IMAGE</text>
</svg>`;
}
