import { useCallback, useMemo } from 'react';
import {
  findingSearchQuerySchema,
  type FindingSearchQuery,
} from '@emberline/contracts/fleet-findings';
import { can } from '@emberline/contracts/permissions';
import { useSearchParams } from 'react-router-dom';
import { PageHeader } from '../../components/ui/page';
import { RequirePermission } from '../../features/auth/components/require-permission';
import { useSignedInUser } from '../../features/auth/hooks/use-signed-in-user';
import { useEngineModel, useEngineModels } from '../../features/engine-models/api/engine-models';
import { searchParamsOf } from '../../features/fleet-findings/api/fleet-findings';
import { FindingsSearch } from '../../features/fleet-findings/components/findings-search';
import { useOrganisations } from '../../features/organisations/api/organisations';

const defaults = findingSearchQuerySchema.parse({});

/** The search from the address bar, so that a link reproduces it; bad values fall back. */
function queryFrom(params: URLSearchParams) {
  const parsed = findingSearchQuerySchema.safeParse(Object.fromEntries(params.entries()));
  return parsed.success ? parsed.data : defaults;
}

export function FindingsRoute() {
  const user = useSignedInUser();
  const [params, setParams] = useSearchParams();
  const query = useMemo(() => queryFrom(params), [params]);
  const seesOwners = can(user.role, 'read:organisation');
  const owners = useOrganisations(seesOwners);
  const models = useEngineModels();
  // The rows to choose from: the searched model's, or the one model's when there is only one.
  const only = models.data?.length === 1 ? models.data[0]!.id : null;
  const model = useEngineModel(query.modelId ?? only);
  const onChange = useCallback(
    (changes: Partial<FindingSearchQuery>) =>
      setParams(
        (current) => {
          const next: FindingSearchQuery = { ...queryFrom(current), ...changes };
          // What the defaults say need not be in the address.
          for (const key of ['page', 'pageSize', 'sort', 'order'] as const)
            if (next[key] === defaults[key]) delete next[key];
          return searchParamsOf(next);
        },
        { replace: true },
      ),
    [setParams],
  );
  return (
    <RequirePermission permission="read:inspection">
      <PageHeader
        title="Findings"
        description={
          seesOwners
            ? 'Every recorded finding of the fleet, from inspections submitted for review or released: filter, sort and open the still it was measured on.'
            : `The recorded findings of ${user.organisationName}’s released inspections, with the decisions as released.`
        }
      />
      <FindingsSearch
        query={query}
        onChange={onChange}
        models={models.data ?? []}
        rows={model.data?.rows ?? []}
        owners={seesOwners ? (owners.data ?? []) : null}
      />
    </RequirePermission>
  );
}
