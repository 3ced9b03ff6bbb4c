import type { Image } from '@emberline/contracts/inspections';
import { imageUrl } from '../../../lib/image-urls';

export function ImageStrip({
  images,
  selected,
  onSelect,
}: {
  images: Image[];
  selected: number;
  onSelect: (index: number) => void;
}) {
  if (images.length === 0) return <p className="text-sm text-soot-600">No image yet.</p>;
  return (
    <ul
      className="flex gap-2 overflow-x-auto pb-2"
      aria-label="Images of this inspection"
      data-testid="image-strip"
    >
      {images.map((image, index) => (
        <li key={image.id} className="shrink-0">
          <button
            type="button"
            onClick={() => onSelect(index)}
            aria-current={index === selected || undefined}
            className={`block overflow-hidden rounded border-2 ${index === selected ? 'border-ember-500' : 'border-transparent hover:border-soot-300'}`}
          >
            <img
              src={imageUrl(image.id, 'thumbnail')}
              alt={image.originalName}
              loading="lazy"
              width={128}
              height={96}
              className="h-24 w-32 bg-soot-900 object-cover"
            />
          </button>
        </li>
      ))}
    </ul>
  );
}
