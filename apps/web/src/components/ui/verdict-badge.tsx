import type { Category } from '@emberline/contracts/limits';
import { verdictStyles } from '@emberline/drawings/verdict-style';

/** A verdict as a word on its own colour, with the glyph the stage ring uses: readable without colour. */
export function VerdictBadge({ category }: { category: Category }) {
  const style = verdictStyles[category];
  const glyph = { ring: '○', triangle: '△', diamond: '◇', 'square-cross': '☒' }[style.glyph];
  return (
    <span
      className="inline-flex w-fit items-center gap-1 rounded border px-2 py-0.5 text-xs font-semibold"
      style={{ background: style.fill, borderColor: style.stroke, color: '#1d1a16' }}
      data-category={category}
    >
      <span aria-hidden>{glyph}</span>
      {style.label}
    </span>
  );
}
