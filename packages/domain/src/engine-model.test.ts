import { describe, expect, it } from 'vitest';
import type { EngineModelRow } from '@emberline/contracts/fleet';
import { rowChangeProblems } from './engine-model';

const row: EngineModelRow = {
  key: 'hpt1-blade',
  label: 'HPT stage 1 blades',
  kind: 'blade',
  count: 64,
  numbering: {
    positionOne: "12 o'clock",
    direction: 'clockwise',
    viewpoint: 'aft-looking-forward',
  },
  zones: ['leading-edge', 'tip'],
  ports: ['BP-3'],
};

describe('changes to rows in use', () => {
  const inUse = new Set(['hpt1-blade']);

  it('allows a new label or port on a row in use, and anything on a row not in use', () => {
    expect(
      rowChangeProblems([row], [{ ...row, label: 'HPT 1 blades', ports: ['BP-3', 'BP-4'] }], inUse),
    ).toEqual([]);
    expect(rowChangeProblems([row], [{ ...row, count: 66 }], new Set())).toEqual([]);
  });

  it('refuses to change the count, numbering or zones of a row in use, or to remove it', () => {
    expect(rowChangeProblems([row], [{ ...row, count: 66 }], inUse)).toEqual([
      'hpt1-blade has recorded findings: its 64 positions cannot change to 66',
    ]);
    expect(
      rowChangeProblems(
        [row],
        [{ ...row, numbering: { ...row.numbering, direction: 'counter-clockwise' } }],
        inUse,
      )[0],
    ).toMatch(/numbering/);
    expect(rowChangeProblems([row], [{ ...row, zones: ['tip'] }], inUse)[0]).toMatch(/zones/);
    expect(rowChangeProblems([row], [], inUse)[0]).toMatch(/cannot be removed: make a new version/);
  });
});
