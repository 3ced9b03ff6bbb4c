import { AuditLogView } from '../../../features/audit/components/audit-log-view';
import { useUsers } from '../../../features/users/api/users';

export function AdminAuditLogRoute() {
  const users = useUsers();
  return (
    <>
      <p className="mb-4 text-sm text-soot-600">
        Every change, newest first. Entries are never edited or removed.
      </p>
      <AuditLogView
        people={(users.data?.items ?? []).map((user) => ({ id: user.id, name: user.name }))}
      />
    </>
  );
}
