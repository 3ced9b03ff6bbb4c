import { deliveryKindLabels, type Delivery } from '@emberline/contracts/reports';
import { outboxStateLabels } from '@emberline/contracts/outbox';
import { LoadingLine } from '../../../components/ui/page';
import { Notice } from '../../../components/ui/notice';
import { formatDateTime } from '../../../lib/format';
import { useDeliveries } from '../api/reports';

const stateTone: Record<Delivery['state'], string> = {
  queued: 'bg-soot-100 text-soot-800',
  sending: 'bg-soot-100 text-soot-800',
  sent: 'bg-emerald-100 text-emerald-900',
  failed: 'bg-amber-100 text-amber-900',
  'needs-attention': 'bg-red-100 text-red-900',
};

/**
 * The delivery log of an inspection: each report revision's e-mail and every urgent notice to its
 * owner, with the recipients, where each stands, the attempts and the last error.
 */
export function DeliveryLog({ inspectionId }: { inspectionId: string }) {
  const log = useDeliveries(inspectionId);
  if (log.isPending) return <LoadingLine />;
  if (log.error) return <Notice tone="error">{log.error.message}</Notice>;
  if (log.data.items.length === 0)
    return <p className="text-sm text-soot-700">Nothing has been e-mailed to the owner yet.</p>;
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-left text-sm" aria-label="Delivery log">
        <thead className="border-b border-soot-200 text-xs uppercase text-soot-600">
          <tr>
            <th className="py-2 pr-3">E-mail</th>
            <th className="py-2 pr-3">To</th>
            <th className="py-2 pr-3">Where it stands</th>
            <th className="py-2 pr-3">Queued</th>
            <th className="py-2">Sent</th>
          </tr>
        </thead>
        <tbody>
          {log.data.items.map((item) => (
            <tr key={item.id} className="border-b border-soot-100 align-top">
              <td className="py-2 pr-3">
                {deliveryKindLabels[item.kind]}
                {item.revision !== null ? `, revision ${item.revision}` : ''}
              </td>
              <td className="py-2 pr-3">
                <ul>
                  {item.recipients.map((recipient) => (
                    <li key={recipient.address}>
                      {recipient.address}
                      {recipient.state === 'refused' ? (
                        <span className="text-red-900">
                          {' '}
                          refused{recipient.error ? `: ${recipient.error}` : ''}
                        </span>
                      ) : null}
                    </li>
                  ))}
                </ul>
              </td>
              <td className="py-2 pr-3">
                <span
                  className={`inline-block rounded px-2 py-0.5 text-xs font-medium ${stateTone[item.state]}`}
                >
                  {outboxStateLabels[item.state]}
                </span>
                {item.attempts > 1 || item.state === 'failed' ? (
                  <span className="block text-xs text-soot-700">
                    {item.attempts} {item.attempts === 1 ? 'attempt' : 'attempts'}
                    {item.state === 'failed' && item.nextAttemptAt
                      ? `, next ${formatDateTime(item.nextAttemptAt)}`
                      : ''}
                  </span>
                ) : null}
                {item.lastError && item.state !== 'sent' ? (
                  <span className="block break-words text-xs text-red-900">{item.lastError}</span>
                ) : null}
              </td>
              <td className="py-2 pr-3">{formatDateTime(item.createdAt)}</td>
              <td className="py-2">{item.sentAt ? formatDateTime(item.sentAt) : '—'}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
