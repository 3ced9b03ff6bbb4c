import { outboxStateLabels, type OutboxState } from '@emberline/contracts/outbox';
import { AlertTriangle, CheckCircle2, Clock, RotateCcw, Send } from 'lucide-react';

const looks: Record<OutboxState, { Icon: typeof Clock; className: string }> = {
  queued: { Icon: Clock, className: 'border-soot-300 bg-soot-50 text-soot-800' },
  sending: { Icon: Send, className: 'border-sky-300 bg-sky-50 text-sky-900' },
  sent: { Icon: CheckCircle2, className: 'border-emerald-300 bg-emerald-50 text-emerald-900' },
  failed: { Icon: RotateCcw, className: 'border-amber-300 bg-amber-50 text-amber-950' },
  'needs-attention': { Icon: AlertTriangle, className: 'border-red-300 bg-red-50 text-red-900' },
};

/** A message's state as a word with its own shape, readable without colour. */
export function OutboxStateBadge({ state }: { state: OutboxState }) {
  const { Icon, className } = looks[state];
  return (
    <span
      className={`inline-flex w-fit items-center gap-1 rounded border px-2 py-0.5 text-xs font-semibold ${className}`}
      data-state={state}
    >
      <Icon className="size-3.5" aria-hidden />
      {outboxStateLabels[state]}
    </span>
  );
}
