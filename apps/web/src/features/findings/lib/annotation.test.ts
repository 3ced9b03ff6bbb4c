import { describe, expect, it } from 'vitest';
import {
  annotationReducer,
  calibrationFrom,
  initialAnnotation,
  type AnnotationState,
} from './annotation';

const run = (
  actions: Parameters<typeof annotationReducer>[1][],
  from: AnnotationState = initialAnnotation,
) => actions.reduce(annotationReducer, from);

describe('the drawing in progress', () => {
  it('completes a reference after two points and a point after one', () => {
    const reference = run([
      { type: 'choose', tool: 'reference' },
      { type: 'add', point: [0, 0] },
    ]);
    expect(reference.complete).toBe(false);
    expect(annotationReducer(reference, { type: 'add', point: [10, 0] }).complete).toBe(true);
    expect(
      run([
        { type: 'choose', tool: 'point' },
        { type: 'add', point: [5, 5] },
      ]).complete,
    ).toBe(true);
  });

  it('finishes a line only with two points and an outline only with three', () => {
    const line = run([
      { type: 'choose', tool: 'polyline' },
      { type: 'add', point: [0, 0] },
      { type: 'finish' },
    ]);
    expect(line.complete).toBe(false);
    expect(
      annotationReducer(annotationReducer(line, { type: 'add', point: [3, 4] }), { type: 'finish' })
        .complete,
    ).toBe(true);
    const outline = run([
      { type: 'choose', tool: 'polygon' },
      { type: 'add', point: [0, 0] },
      { type: 'add', point: [3, 0] },
      { type: 'finish' },
    ]);
    expect(outline.complete).toBe(false);
  });

  it('undoes and redoes points, moves and removals', () => {
    const drawn = run([
      { type: 'choose', tool: 'polyline' },
      { type: 'add', point: [0, 0] },
      { type: 'add', point: [1, 1] },
      { type: 'move', index: 1, point: [2, 2], record: true },
    ]);
    expect(drawn.points).toEqual([
      [0, 0],
      [2, 2],
    ]);
    const undone = annotationReducer(drawn, { type: 'undo' });
    expect(undone.points).toEqual([
      [0, 0],
      [1, 1],
    ]);
    expect(annotationReducer(undone, { type: 'redo' }).points).toEqual([
      [0, 0],
      [2, 2],
    ]);
    const removed = annotationReducer(drawn, { type: 'remove', index: 0 });
    expect(removed.points).toEqual([[2, 2]]);
    expect(annotationReducer(removed, { type: 'undo' }).points).toEqual([
      [0, 0],
      [2, 2],
    ]);
    // A new point after an undo drops the redo history.
    expect(annotationReducer(undone, { type: 'add', point: [9, 9] }).future).toEqual([]);
  });

  it('ignores points while panning and starts afresh on a new tool', () => {
    expect(run([{ type: 'add', point: [1, 1] }]).points).toEqual([]);
    const switched = run([
      { type: 'choose', tool: 'polyline' },
      { type: 'add', point: [1, 1] },
      { type: 'choose', tool: 'polygon' },
    ]);
    expect(switched).toMatchObject({ tool: 'polygon', points: [], past: [] });
  });

  it('makes a calibration only with its true size', () => {
    expect(
      calibrationFrom(
        'reference',
        [
          [0, 0],
          [10, 0],
        ],
        {},
      ),
    ).toBeNull();
    expect(
      calibrationFrom(
        'reference',
        [
          [0, 0],
          [10, 0],
        ],
        { lengthMm: 4 },
      ),
    ).toEqual({
      kind: 'reference',
      p1: [0, 0],
      p2: [10, 0],
      lengthMm: 4,
    });
    expect(
      calibrationFrom(
        'plane',
        [
          [0, 0],
          [10, 0],
          [10, 5],
          [0, 5],
        ],
        { widthMm: 2, heightMm: 1 },
      )?.kind,
    ).toBe('plane');
  });
});
