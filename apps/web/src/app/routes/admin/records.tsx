import { RecordsCheck } from '../../../features/records/components/records-check';

export function AdminRecordsRoute() {
  return (
    <div className="flex flex-col gap-4">
      <p className="text-sm text-soot-600">
        Signatures and audit rows form two sealed chains. This check walks both, recomputes every
        hash and seal, and names any record changed, removed or forged behind the product’s back.
        The same check runs from the command line as <code>pnpm verify-records</code>.
      </p>
      <RecordsCheck />
    </div>
  );
}
