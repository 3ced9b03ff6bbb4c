import type { Calibration, ImagePoint, ShapeKind } from '@emberline/contracts/measurement';

export type Tool = 'pan' | 'reference' | 'plane' | 'polyline' | 'polygon' | 'point';

/** The tools, their keys (shown in the tool tips) and what each asks of the inspector. */
export const toolList: { tool: Tool; label: string; key: string; hint: string }[] = [
  { tool: 'pan', label: 'Pan and zoom', key: 'V', hint: 'Drag to pan, wheel or +/− to zoom' },
  {
    tool: 'reference',
    label: 'Reference scale',
    key: 'R',
    hint: 'Pick two points a known distance apart',
  },
  {
    tool: 'plane',
    label: 'Plane',
    key: 'C',
    hint: 'Pick the four corners of a known rectangle, in order',
  },
  {
    tool: 'polyline',
    label: 'Line',
    key: 'L',
    hint: 'Pick points along the damage; Enter to finish',
  },
  {
    tool: 'polygon',
    label: 'Outline',
    key: 'O',
    hint: 'Pick points around the damage; Enter to close',
  },
  { tool: 'point', label: 'Point', key: 'P', hint: 'Pick where the damage is' },
];

/** How many points complete each drawing tool (null: the inspector says when). */
export const pointsToComplete: Record<Exclude<Tool, 'pan'>, number | null> = {
  reference: 2,
  plane: 4,
  polyline: null,
  polygon: null,
  point: 1,
};

export const shapeOf = (tool: Tool): ShapeKind | null =>
  tool === 'polyline' || tool === 'polygon' || tool === 'point' ? tool : null;

export interface AnnotationState {
  tool: Tool;
  points: ImagePoint[];
  /** True once the shape is complete and waits for its form (distance, or the finding). */
  complete: boolean;
  past: { points: ImagePoint[]; complete: boolean }[];
  future: { points: ImagePoint[]; complete: boolean }[];
}

export type AnnotationAction =
  | { type: 'choose'; tool: Tool }
  | { type: 'add'; point: ImagePoint }
  | { type: 'move'; index: number; point: ImagePoint; record: boolean }
  | { type: 'remove'; index: number }
  | { type: 'finish' }
  | { type: 'undo' }
  | { type: 'redo' }
  | { type: 'clear' };

export const initialAnnotation: AnnotationState = {
  tool: 'pan',
  points: [],
  complete: false,
  past: [],
  future: [],
};

const minimum: Record<Exclude<Tool, 'pan'>, number> = {
  reference: 2,
  plane: 4,
  polyline: 2,
  polygon: 3,
  point: 1,
};

function step(state: AnnotationState, points: ImagePoint[], complete: boolean): AnnotationState {
  return {
    ...state,
    points,
    complete,
    past: [...state.past, { points: state.points, complete: state.complete }].slice(-200),
    future: [],
  };
}

/** The drawing in progress: a pure reducer, so that undo and redo are a matter of history. */
export function annotationReducer(
  state: AnnotationState,
  action: AnnotationAction,
): AnnotationState {
  switch (action.type) {
    case 'choose':
      return { ...initialAnnotation, tool: action.tool };
    case 'add': {
      if (state.tool === 'pan' || state.complete) return state;
      const points = [...state.points, action.point];
      const needed = pointsToComplete[state.tool];
      return step(state, points, needed !== null && points.length >= needed);
    }
    case 'move': {
      const points = state.points.map((point, index) =>
        index === action.index ? action.point : point,
      );
      return action.record ? step(state, points, state.complete) : { ...state, points };
    }
    case 'remove': {
      if (action.index < 0 || action.index >= state.points.length) return state;
      return step(
        state,
        state.points.filter((_, index) => index !== action.index),
        false,
      );
    }
    case 'finish':
      if (state.tool === 'pan' || state.complete || state.points.length < minimum[state.tool])
        return state;
      return step(state, state.points, true);
    case 'undo': {
      const previous = state.past.at(-1);
      if (!previous) return state;
      return {
        ...state,
        ...previous,
        past: state.past.slice(0, -1),
        future: [{ points: state.points, complete: state.complete }, ...state.future],
      };
    }
    case 'redo': {
      const next = state.future[0];
      if (!next) return state;
      return {
        ...state,
        ...next,
        past: [...state.past, { points: state.points, complete: state.complete }],
        future: state.future.slice(1),
      };
    }
    case 'clear':
      return { ...initialAnnotation, tool: state.tool };
  }
}

/** The calibration the picked points make, given the true size the inspector entered (mm). */
export function calibrationFrom(
  tool: Tool,
  points: ImagePoint[],
  sizes: { lengthMm?: number; widthMm?: number; heightMm?: number },
): Calibration | null {
  if (tool === 'reference' && points.length === 2 && sizes.lengthMm)
    return { kind: 'reference', p1: points[0]!, p2: points[1]!, lengthMm: sizes.lengthMm };
  if (tool === 'plane' && points.length === 4 && sizes.widthMm && sizes.heightMm)
    return {
      kind: 'plane',
      corners: [points[0]!, points[1]!, points[2]!, points[3]!],
      widthMm: sizes.widthMm,
      heightMm: sizes.heightMm,
    };
  return null;
}

export const MM_PER_INCH = 25.4;
