import { OutboxView } from '../../../features/outbox/components/outbox-view';

export function AdminOutboxRoute() {
  return (
    <>
      <p className="mb-4 text-sm text-soot-600">
        Until a real SMTP relay is configured, Emberline keeps every message it sends here, and
        nothing leaves this machine.
      </p>
      <OutboxView />
    </>
  );
}
