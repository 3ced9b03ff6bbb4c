import { useCallback, useMemo } from 'react';
import { can } from '@emberline/contracts/permissions';
import { reportListQuerySchema, type ReportListQuery } from '@emberline/contracts/reports';
import { useSearchParams } from 'react-router-dom';
import { PageHeader } from '../../components/ui/page';
import { RequirePermission } from '../../features/auth/components/require-permission';
import { useSignedInUser } from '../../features/auth/hooks/use-signed-in-user';
import { useOrganisations } from '../../features/organisations/api/organisations';
import { ReportsTable } from '../../features/reports/components/reports-table';

/** The list from the address bar, so that a link reproduces it; bad values fall back. */
function queryFrom(params: URLSearchParams) {
  const parsed = reportListQuerySchema.safeParse(Object.fromEntries(params.entries()));
  return parsed.success ? parsed.data : reportListQuerySchema.parse({});
}

export function ReportsRoute() {
  const user = useSignedInUser();
  const [params, setParams] = useSearchParams();
  const query = useMemo(() => queryFrom(params), [params]);
  const seesOwners = can(user.role, 'read:organisation');
  const owners = useOrganisations(seesOwners);
  const onChange = useCallback(
    (changes: Partial<ReportListQuery>) =>
      setParams(
        (current) => {
          const next = { ...queryFrom(current), ...changes };
          const search = new URLSearchParams();
          for (const [key, value] of Object.entries(next))
            if (value !== undefined && value !== '' && !(key === 'page' && value === 1))
              if (!(key === 'pageSize' && value === 25)) search.set(key, String(value));
          return search;
        },
        { replace: true },
      ),
    [setParams],
  );
  return (
    <RequirePermission permission="read:report">
      <PageHeader
        title="Reports"
        description={
          seesOwners
            ? 'Every signed report issued, newest first, with where its e-mail to the owner stands.'
            : `The signed reports of ${user.organisationName}’s engines, newest first, as e-mailed to your contacts for reports.`
        }
      />
      <ReportsTable
        query={query}
        onChange={onChange}
        owners={seesOwners ? (owners.data ?? []) : null}
      />
    </RequirePermission>
  );
}
