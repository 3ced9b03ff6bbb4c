import type { FindingDetails } from '@emberline/contracts/findings';
import type { EngineModelRow } from '@emberline/contracts/fleet';

/** The details a new finding gets, placed from the image's own row and position when it has them. */
export function blankDetails(
  row: EngineModelRow | undefined,
  position: number | null,
): FindingDetails {
  return {
    row: row?.key ?? '',
    position: position ?? Number.NaN,
    zone: row?.zones[0] ?? '',
    damage: 'crack',
    method: 'image',
    lengthMm: null,
    areaMm2: null,
    uncertaintyMm: null,
    uncertaintyMm2: null,
    widthMm: null,
    depthMm: null,
    count: null,
    notes: '',
    previousFindingId: null,
  };
}
