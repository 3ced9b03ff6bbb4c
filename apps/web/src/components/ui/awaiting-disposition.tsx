import type { Engine } from '@emberline/contracts/fleet';

/**
 * An engine whose submitted inspection waits for an engineer: in words and a glyph, not colour
 * alone; a beyond-limits verdict says so, since the engine may have to come off wing.
 */
export function AwaitingDisposition({
  awaiting,
}: {
  awaiting: NonNullable<Engine['awaitingDisposition']>;
}) {
  return (
    <span
      className={`inline-flex w-fit items-center gap-1 rounded border px-1.5 py-0.5 text-xs font-semibold ${awaiting.beyondLimits ? 'border-red-700 bg-red-50 text-red-900' : 'border-soot-500 bg-soot-50 text-soot-800'}`}
      data-testid="awaiting-disposition"
    >
      <span aria-hidden>{awaiting.beyondLimits ? '☒' : '…'}</span>
      {awaiting.beyondLimits ? 'Awaiting disposition, beyond limits' : 'Awaiting disposition'}
    </span>
  );
}
