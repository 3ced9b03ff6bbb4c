import { Link } from 'react-router-dom';
import { useOutboxSummary } from '../api/outbox';

/** For admins, on every page while any e-mail waits for a person: a lost alert is a safety matter. */
export function OutboxAttentionBanner({ enabled }: { enabled: boolean }) {
  const summary = useOutboxSummary(enabled);
  const waiting = summary.data?.counts['needs-attention'] ?? 0;
  if (!enabled || waiting === 0) return null;
  return (
    <p role="alert" className="bg-red-700 px-6 py-2 text-center text-sm text-white">
      {waiting === 1
        ? '1 e-mail could not be delivered'
        : `${waiting} e-mails could not be delivered`}{' '}
      and {waiting === 1 ? 'needs' : 'need'} attention.{' '}
      <Link to="/admin/outbox?state=needs-attention" className="font-semibold underline">
        Open the outbox
      </Link>
    </p>
  );
}
