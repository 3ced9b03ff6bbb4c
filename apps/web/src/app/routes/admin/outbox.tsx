import { CaughtMail } from '../../../features/outbox/components/caught-mail';
import { OutboxMessages } from '../../../features/outbox/components/outbox-messages';

export function AdminOutboxRoute() {
  return (
    <div className="flex flex-col gap-8">
      <p className="text-sm text-soot-600">
        Every e-mail is kept here from the moment it is written until the mail server takes it; one
        that fails is tried again after 1, 2, 4, 8, 16 and 32 minutes, then waits for you.
        Single-use links are withheld: only their recipient sees them.
      </p>
      <OutboxMessages />
      <CaughtMail />
    </div>
  );
}
