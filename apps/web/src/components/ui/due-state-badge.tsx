import { dueStateLabels, type DueState } from '@emberline/contracts/planning';

/** Each state by a word and a shape, so that colour is never the only sign. */
const styles: Record<DueState, { glyph: string; className: string }> = {
  overdue: { glyph: '▲', className: 'border-red-700 bg-red-50 text-red-900' },
  'due-soon': { glyph: '◆', className: 'border-amber-600 bg-amber-50 text-amber-950' },
  ok: { glyph: '●', className: 'border-emerald-700 bg-emerald-50 text-emerald-900' },
  unknown: { glyph: '?', className: 'border-soot-500 bg-soot-50 text-soot-800' },
  'awaiting-disposition': { glyph: '☒', className: 'border-red-700 bg-red-50 text-red-900' },
  'in-shop': { glyph: '⌂', className: 'border-soot-500 bg-soot-100 text-soot-800' },
  removed: { glyph: '✕', className: 'border-soot-500 bg-soot-100 text-soot-800' },
};

export function DueStateBadge({ state }: { state: DueState }) {
  const style = styles[state];
  return (
    <span
      className={`inline-flex w-fit items-center gap-1 rounded border px-2 py-0.5 text-xs font-semibold ${style.className}`}
      data-due-state={state}
    >
      <span aria-hidden>{style.glyph}</span>
      {dueStateLabels[state]}
    </span>
  );
}
