import type { DueMove } from '@emberline/contracts/planning';
import { dueWords } from '@emberline/domain/due-status';
import { formatDateTime } from '../../../lib/format';

/** How the next due date last moved: from what to what, why and when; a booking it overran. */
export function DueMoveNote({ move, compact = false }: { move: DueMove; compact?: boolean }) {
  return (
    <p
      className={`text-xs ${move.bookingOverrun ? 'font-medium text-red-900' : 'text-soot-700'}`}
      data-testid="due-move"
    >
      {move.bookingOverrun ? (
        <span aria-hidden className="mr-1">
          ▲
        </span>
      ) : null}
      Moved from {dueWords(move.from)} to {dueWords(move.to)}
      {compact ? '' : ` on ${formatDateTime(move.at)}`}: {move.reason}
      {move.bookingOverrun ? ' The booking is now after the due date: book it again.' : ''}
    </p>
  );
}
