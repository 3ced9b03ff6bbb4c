import { AuditLogView } from '../../../features/audit/components/audit-log-view';

export function AdminAuditLogRoute() {
  return (
    <>
      <p className="mb-4 text-sm text-soot-600">
        Every change, newest first. Entries are never edited or removed.
      </p>
      <AuditLogView />
    </>
  );
}
