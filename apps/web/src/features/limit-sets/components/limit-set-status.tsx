import { limitSetStatusLabels, type LimitSetStatus } from '@emberline/contracts/limit-sets';

const looks: Record<LimitSetStatus, string> = {
  draft: 'border-dashed border-soot-500 text-soot-800',
  published: 'border-emerald-700 bg-emerald-50 text-emerald-900',
  superseded: 'border-soot-300 text-soot-500 line-through decoration-1',
};

export function LimitSetStatusBadge({ status }: { status: LimitSetStatus }) {
  return (
    <span className={`rounded border px-1.5 py-0.5 text-xs font-medium ${looks[status]}`}>
      {limitSetStatusLabels[status]}
    </span>
  );
}

export function InventedLabel() {
  return (
    <span className="rounded bg-amber-100 px-1.5 py-0.5 text-xs font-medium text-amber-950">
      Invented for the demo — not from any engine manual
    </span>
  );
}
