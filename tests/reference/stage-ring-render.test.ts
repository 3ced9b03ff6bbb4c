import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import {
  stageRing,
  stageRingGeometry,
  type StageRingInput,
} from '../../packages/drawings/src/stage-ring';
import { renderSvg } from '../../packages/drawings/src/svg';
import { unmarkedStyle, verdictStyles } from '../../packages/drawings/src/verdict-style';

// The stage ring rendered by an independent SVG renderer (librsvg, through sharp): the pixels
// where the geometry puts each sector must carry that sector's fill.
const hex = (colour: string) => [1, 3, 5].map((at) => parseInt(colour.slice(at, at + 2), 16));

async function pixels(input: StageRingInput) {
  const svg = renderSvg(stageRing(input));
  const { data, info } = await sharp(Buffer.from(svg))
    .removeAlpha()
    .raw()
    .toBuffer({ resolveWithObject: true });
  return (x: number, y: number) => {
    const at = (Math.round(y) * info.width + Math.round(x)) * 3;
    return [data[at]!, data[at + 1]!, data[at + 2]!];
  };
}

describe('stage ring as drawn by librsvg', () => {
  it('fills the sector of each position at the place the geometry gives, clockwise from 12', async () => {
    const input: StageRingInput = {
      count: 12,
      positionOneClock: 12,
      direction: 'clockwise',
      viewpoint: 'aft looking forward',
      title: 'Test row',
      verdicts: new Map([
        [1, 'beyond-limits'],
        [4, 'repeat-inspection'],
      ]),
    };
    const pixel = await pixels(input);
    const geometry = stageRingGeometry(input);
    const middle = (position: number) => {
      const sector = geometry.sectors[position - 1]!;
      const radius = (geometry.inner + geometry.outer) / 2;
      const radians = (sector.midAngle * Math.PI) / 180;
      return [
        geometry.centre[0] + radius * Math.sin(radians),
        geometry.centre[1] - radius * Math.cos(radians),
      ] as const;
    };
    // Position 1 at the top, position 4 at 3 o'clock (right of centre, level with it).
    const [x1, y1] = middle(1);
    expect(y1).toBeLessThan(geometry.centre[1]);
    expect(pixel(x1, y1)).toEqual(hex(verdictStyles['beyond-limits'].fill));
    const [x4, y4] = middle(4);
    expect(x4).toBeGreaterThan(geometry.centre[0]);
    expect(pixel(x4, y4)).toEqual(hex(verdictStyles['repeat-inspection'].fill));
    expect(pixel(...middle(7))).toEqual(hex(unmarkedStyle.fill));
  });
});
