import { Link } from 'react-router-dom';
import { formatDate } from '../../../lib/format';
import { useUndeliveredUrgent } from '../api/reports';

/**
 * For engineers and administrators, on every page while an urgent notice (remove before the next
 * flight) has not reached its owner: someone must tell them by other means.
 */
export function UrgentNoticeBanner({ enabled }: { enabled: boolean }) {
  const notices = useUndeliveredUrgent(enabled);
  const items = notices.data?.items ?? [];
  if (!enabled || items.length === 0) return null;
  return (
    <div role="alert" className="bg-red-800 px-6 py-2 text-sm text-white">
      <ul className="mx-auto flex max-w-7xl flex-col gap-1">
        {items.map((item) => (
          <li key={item.id}>
            <span className="font-semibold">
              Urgent notice not delivered: engine {item.engineSerialNumber} ({item.organisationName}
              ), inspection of {formatDate(item.inspectionDate)}.
            </span>{' '}
            The e-mail to {item.recipients.map((recipient) => recipient.address).join(', ')} failed
            {item.lastError ? ` (${item.lastError})` : ''}; tell the owner by telephone that the
            engine must not fly again as it is.{' '}
            <Link to={`/inspections/${item.inspectionId}`} className="font-semibold underline">
              Open the inspection
            </Link>
          </li>
        ))}
        {(notices.data?.total ?? 0) > items.length ? (
          <li className="font-semibold">
            And {notices.data!.total - items.length} more urgent notices not delivered.
          </li>
        ) : null}
      </ul>
    </div>
  );
}
