import { useState, type ReactNode } from 'react';
import type { Image } from '@emberline/contracts/inspections';
import { TransformComponent, TransformWrapper } from 'react-zoom-pan-pinch';
import { imageUrl } from '../lib/image-urls';

// Past this zoom the 1600 px preview is coarser than the screen: the full image takes over.
const FULL_AT_SCALE = 2;

/**
 * A still at preview resolution that switches to the full image when zoomed in, with previous and
 * next (arrow keys), zoom and fit; the annotation layer is drawn over it in the image's frame.
 */
export function ImageViewer({
  images,
  index,
  onIndex,
  rowLabel,
  details,
  toolbar,
  overlay,
  leftButtonPans = true,
}: {
  images: Image[];
  index: number;
  onIndex: (index: number) => void;
  /** A row's name from its key, for the image's text alternative. */
  rowLabel: (key: string) => string;
  /** Shown beneath the image: what the still shows (its row and position). */
  details?: (image: Image) => ReactNode;
  /** Tools shown above the image (the drawing tools). */
  toolbar?: ReactNode;
  /** Drawn over the image in its own frame (the annotation layer); it zooms and pans with it. */
  overlay?: (image: Image) => ReactNode;
  /** False while a drawing tool is in use: the left button then places points, the middle pans. */
  leftButtonPans?: boolean;
}) {
  const image = images[index];
  const [deep, setDeep] = useState<Record<string, boolean>>({});
  if (!image) return null;
  const full = deep[image.id] ?? false;
  const go = (step: number) => onIndex((index + step + images.length) % images.length);
  return (
    <section
      aria-label="Image viewer"
      tabIndex={0}
      onKeyDown={(event) => {
        if (event.key === 'ArrowRight') {
          event.preventDefault();
          go(1);
        } else if (event.key === 'ArrowLeft') {
          event.preventDefault();
          go(-1);
        }
      }}
      className="flex flex-col gap-3 rounded-lg border border-soot-200 bg-soot-950 p-3 text-soot-100 focus-visible:outline-2"
    >
      <div className="flex flex-wrap items-center justify-between gap-2 text-sm">
        <p>
          <span className="font-medium" data-shows-ids>
            {image.originalName}
          </span>{' '}
          · {image.width}×{image.height} px · image {index + 1} of {images.length}
          {image.videoFileName
            ? ` · frame at ${image.videoTimeSeconds?.toFixed(2)} s of ${image.videoFileName}`
            : ''}
        </p>
        <div className="flex gap-2">
          <button
            type="button"
            className="rounded border border-soot-600 px-2 py-1 hover:bg-soot-800"
            onClick={() => go(-1)}
            aria-label="Previous image (left arrow)"
          >
            ←
          </button>
          <button
            type="button"
            className="rounded border border-soot-600 px-2 py-1 hover:bg-soot-800"
            onClick={() => go(1)}
            aria-label="Next image (right arrow)"
          >
            →
          </button>
        </div>
      </div>
      <TransformWrapper
        key={image.id}
        minScale={1}
        maxScale={16}
        doubleClick={{ step: 1.5, disabled: !leftButtonPans }}
        panning={{ allowLeftClickPan: leftButtonPans, allowMiddleClickPan: true }}
        onTransform={(_ref, state) => {
          if (state.scale >= FULL_AT_SCALE && !full) setDeep({ ...deep, [image.id]: true });
        }}
      >
        {({ zoomIn, zoomOut, resetTransform }) => (
          <>
            {toolbar}
            <div className="flex gap-2 text-xs">
              <button
                type="button"
                className="rounded border border-soot-600 px-2 py-1 hover:bg-soot-800"
                onClick={() => zoomIn(1)}
              >
                Zoom in
              </button>
              <button
                type="button"
                className="rounded border border-soot-600 px-2 py-1 hover:bg-soot-800"
                onClick={() => zoomOut(1)}
              >
                Zoom out
              </button>
              <button
                type="button"
                className="rounded border border-soot-600 px-2 py-1 hover:bg-soot-800"
                onClick={() => resetTransform()}
              >
                Fit
              </button>
              <span className="self-center text-soot-300" data-testid="viewer-resolution">
                {full ? 'Full resolution' : 'Preview'}
              </span>
            </div>
            <TransformComponent
              wrapperClass="!w-full !h-[60vh] bg-black rounded"
              contentClass="!w-full !h-full flex items-center justify-center"
            >
              <div
                className="relative"
                style={{
                  aspectRatio: `${image.width} / ${image.height}`,
                  width: `min(100%, calc(60vh * ${image.width / image.height}))`,
                }}
              >
                <img
                  src={imageUrl(image.id, full ? 'full' : 'preview')}
                  alt={`${image.originalName}${image.rowKey ? `, ${rowLabel(image.rowKey)} position ${image.position}` : ''}`}
                  className="absolute inset-0 h-full w-full"
                  draggable={false}
                />
                {overlay?.(image)}
              </div>
            </TransformComponent>
          </>
        )}
      </TransformWrapper>
      {details ? <div className="rounded bg-white p-3 text-soot-900">{details(image)}</div> : null}
    </section>
  );
}
