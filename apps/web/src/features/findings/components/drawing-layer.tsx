import {
  memo,
  useMemo,
  useRef,
  useState,
  type Dispatch,
  type KeyboardEvent,
  type PointerEvent,
} from 'react';
import type { Image } from '@emberline/contracts/inspections';
import type { Category } from '@emberline/contracts/limits';
import type { Calibration, ImagePoint } from '@emberline/contracts/measurement';
import { annotationOverlay, overlayScale, type OverlayShape } from '@emberline/drawings/overlay';
import { SvgDrawing } from '../../../components/ui/svg-drawing';
import { shapeOf, toolList, type AnnotationAction, type AnnotationState } from '../lib/annotation';

const MemoSvgDrawing = memo(SvgDrawing, (before, after) => before.drawing === after.drawing);
const frame = (image: Image) => ({ x: 0, y: 0, width: image.width, height: image.height });

/** The image point under a pointer, through the SVG's own transform (zoom and pan included). */
function imagePoint(
  svg: SVGSVGElement,
  clientX: number,
  clientY: number,
  image: Image,
): ImagePoint {
  const matrix = svg.getScreenCTM();
  if (!matrix) return [0, 0];
  const point = new DOMPoint(clientX, clientY).matrixTransform(matrix.inverse());
  const clamp = (value: number, max: number) =>
    Math.round(Math.min(Math.max(value, 0), max) * 10) / 10;
  return [clamp(point.x, image.width), clamp(point.y, image.height)];
}

/**
 * The SVG layer over the image, in the image's pixel frame: the recorded findings and the
 * calibration (drawn by the shared overlay function), the shape being drawn with its handles, and a
 * keyboard cursor. Mouse: click to add a point, drag a handle to move it. Keyboard: arrows move the
 * cursor (Shift for ten times as far), Space adds a point, Enter finishes, Backspace removes the
 * selected or last point, Ctrl+Z / Ctrl+Y undo and redo, Escape starts again.
 */
export function DrawingLayer({
  image,
  state,
  dispatch,
  shapes,
  calibration,
  draftCategory,
}: {
  image: Image;
  state: AnnotationState;
  dispatch: Dispatch<AnnotationAction>;
  shapes: OverlayShape[];
  calibration: Calibration | null;
  draftCategory: Category | null;
}) {
  const svg = useRef<SVGSVGElement>(null);
  const [cursor, setCursor] = useState<ImagePoint>([image.width / 2, image.height / 2]);
  const [focused, setFocused] = useState(false);
  const [selected, setSelected] = useState<number | null>(null);
  const dragging = useRef<number | null>(null);
  const scale = overlayScale(image.width, image.height);
  const drawing = state.tool !== 'pan';
  const kind = shapeOf(state.tool);
  const draftShape: OverlayShape[] =
    kind && state.points.length > 0
      ? [
          {
            id: 'draft',
            label: 'New',
            kind: kind === 'polygon' && state.points.length < 3 ? 'polyline' : kind,
            points: state.points,
            category: draftCategory,
          },
        ]
      : [];
  // The recorded shapes are drawn once per change of the findings, not on every click or key:
  // with hundreds of findings on an image that is most of the work of a frame.
  const recordedOverlay = useMemo(
    () => annotationOverlay({ width: image.width, height: image.height, shapes, calibration }),
    [image.width, image.height, shapes, calibration],
  );
  const draftOverlay = annotationOverlay({
    width: image.width,
    height: image.height,
    shapes: draftShape,
  });

  const onKeyDown = (event: KeyboardEvent) => {
    const key = event.key;
    const ctrl = event.ctrlKey || event.metaKey;
    if (ctrl && key.toLowerCase() === 'z') {
      dispatch({ type: event.shiftKey ? 'redo' : 'undo' });
    } else if (ctrl && key.toLowerCase() === 'y') {
      dispatch({ type: 'redo' });
    } else if (!ctrl && key.startsWith('Arrow')) {
      const step = (event.shiftKey ? 10 : 1) * Math.max(1, Math.round(scale.vertex / 3));
      const [x, y] = cursor;
      const next: ImagePoint = [
        Math.min(
          Math.max(x + (key === 'ArrowRight' ? step : key === 'ArrowLeft' ? -step : 0), 0),
          image.width,
        ),
        Math.min(
          Math.max(y + (key === 'ArrowDown' ? step : key === 'ArrowUp' ? -step : 0), 0),
          image.height,
        ),
      ];
      setCursor(next);
      if (selected !== null) dispatch({ type: 'move', index: selected, point: next, record: true });
    } else if (key === ' ' && drawing) {
      dispatch({ type: 'add', point: cursor });
    } else if (key === 'Enter' && drawing) {
      dispatch({ type: 'finish' });
    } else if (key === 'Backspace' || key === 'Delete') {
      dispatch({ type: 'remove', index: selected ?? state.points.length - 1 });
      setSelected(null);
    } else if (key === 'Escape') {
      dispatch({ type: 'clear' });
      setSelected(null);
    } else if (key === 'Tab' && state.points.length > 0 && event.altKey) {
      setSelected((current) => ((current ?? -1) + 1) % state.points.length);
    } else {
      const tool = toolList.find((item) => item.key.toLowerCase() === key.toLowerCase());
      if (!tool || ctrl) return;
      dispatch({ type: 'choose', tool: tool.tool });
      setSelected(null);
    }
    event.preventDefault();
    event.stopPropagation();
  };

  const onPointerMove = (event: PointerEvent<SVGSVGElement>) => {
    if (dragging.current === null || !svg.current) return;
    dispatch({
      type: 'move',
      index: dragging.current,
      point: imagePoint(svg.current, event.clientX, event.clientY, image),
      record: false,
    });
  };

  return (
    <div
      tabIndex={0}
      role="group"
      aria-label={`Drawing area, ${image.width} by ${image.height} pixels. Tool keys: ${toolList.map((tool) => `${tool.key} ${tool.label}`).join(', ')}. Arrows move the cursor, Space adds a point, Enter finishes, Backspace removes a point, Control Z undoes.`}
      onKeyDown={onKeyDown}
      onFocus={() => setFocused(true)}
      onBlur={() => setFocused(false)}
      className="absolute inset-0 outline-none focus-visible:ring-2 focus-visible:ring-ember-400"
      data-testid="drawing-area"
    >
      <svg
        ref={svg}
        // The shapes are listed in words under the image; the drawing itself is not read out.
        aria-hidden="true"
        viewBox={`0 0 ${image.width} ${image.height}`}
        className={`absolute inset-0 h-full w-full ${drawing ? 'cursor-crosshair' : ''}`}
        onClick={(event) => {
          if (!drawing || !svg.current || dragging.current !== null) return;
          const point = imagePoint(svg.current, event.clientX, event.clientY, image);
          setCursor(point);
          dispatch({ type: 'add', point });
        }}
        onPointerMove={onPointerMove}
        onPointerUp={() => {
          // Let the click that ends a drag pass without adding a point.
          setTimeout(() => (dragging.current = null), 0);
        }}
      >
        <MemoSvgDrawing drawing={recordedOverlay} svgProps={frame(image)} />
        <SvgDrawing drawing={draftOverlay} svgProps={frame(image)} />
        {state.points.map(([x, y], index) => (
          <circle
            key={index}
            cx={x}
            cy={y}
            r={scale.vertex * 1.4}
            className="cursor-move"
            fill={selected === index ? '#ffd27a' : '#fffaf0'}
            stroke="#120c08"
            strokeWidth={scale.stroke / 2}
            data-vertex={index}
            onClick={(event) => {
              event.stopPropagation();
              setSelected(index);
            }}
            onPointerDown={(event) => {
              event.stopPropagation();
              (event.target as Element).setPointerCapture(event.pointerId);
              dragging.current = index;
              setSelected(index);
              dispatch({ type: 'move', index, point: [x, y], record: true });
            }}
          />
        ))}
        {focused && drawing ? (
          <g pointerEvents="none" data-testid="keyboard-cursor">
            <circle
              cx={cursor[0]}
              cy={cursor[1]}
              r={scale.vertex * 2}
              fill="none"
              stroke="#7fd1c7"
              strokeWidth={scale.stroke / 2}
            />
            <path
              d={`M ${cursor[0] - scale.vertex * 3} ${cursor[1]} H ${cursor[0] + scale.vertex * 3} M ${cursor[0]} ${cursor[1] - scale.vertex * 3} V ${cursor[1] + scale.vertex * 3}`}
              stroke="#7fd1c7"
              strokeWidth={scale.stroke / 2}
            />
          </g>
        ) : null}
      </svg>
    </div>
  );
}
