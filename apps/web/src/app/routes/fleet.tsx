import { useCallback, useMemo } from 'react';
import { engineListQuerySchema } from '@emberline/contracts/fleet';
import { can } from '@emberline/contracts/permissions';
import { Plus } from 'lucide-react';
import { Link, useSearchParams } from 'react-router-dom';
import { ExportLinks } from '../../components/ui/export-links';
import { PageHeader } from '../../components/ui/page';
import { useSignedInUser } from '../../features/auth/hooks/use-signed-in-user';
import { useEngineModels } from '../../features/engine-models/api/engine-models';
import { FleetTable, type FleetView } from '../../features/fleet/components/fleet-table';
import { useOrganisations } from '../../features/organisations/api/organisations';

const defaults = engineListQuerySchema.parse({});

/** The fleet view from the address bar, so that a link reproduces it; bad values fall back. */
function viewFrom(params: URLSearchParams): FleetView {
  const raw = Object.fromEntries([...params.entries()].filter(([key]) => key !== 'hide'));
  const parsed = engineListQuerySchema.safeParse(raw);
  const query = parsed.success ? parsed.data : defaults;
  return { ...query, hidden: params.get('hide')?.split(',').filter(Boolean) ?? [] };
}

export function FleetRoute() {
  const user = useSignedInUser();
  const [params, setParams] = useSearchParams();
  const view = useMemo(() => viewFrom(params), [params]);
  const models = useEngineModels();
  const seesOwners = can(user.role, 'read:organisation');
  const owners = useOrganisations(seesOwners);

  const onChange = useCallback(
    (changes: Partial<FleetView>) => {
      setParams(
        (current) => {
          const next = { ...viewFrom(current), ...changes };
          const search = new URLSearchParams();
          for (const [key, value] of Object.entries(next)) {
            if (key === 'hidden') continue;
            if (
              value === undefined ||
              value === '' ||
              value === defaults[key as keyof typeof defaults]
            )
              continue;
            search.set(key, String(value));
          }
          if (next.hidden.length) search.set('hide', next.hidden.join(','));
          return search;
        },
        { replace: true },
      );
    },
    [setParams],
  );

  return (
    <>
      <PageHeader
        title="Fleet"
        description={
          seesOwners
            ? 'Every engine Emberline looks after, with its owner, aircraft, TSN and CSN.'
            : `The engines of ${user.organisationName}.`
        }
        actions={
          can(user.role, 'manage:engine') ? (
            <Link
              to="/fleet/new"
              className="inline-flex items-center gap-2 rounded-md bg-ember-700 px-3.5 py-2 text-sm font-medium text-white hover:bg-ember-800"
            >
              <Plus className="size-4" aria-hidden /> Add engine
            </Link>
          ) : null
        }
      />
      <FleetTable
        view={view}
        onChange={onChange}
        models={models.data ?? []}
        owners={seesOwners ? (owners.data ?? []) : null}
      />
      <div className="mt-4">
        <ExportLinks
          label="Export the fleet’s findings (the model and owner chosen above)"
          path="/findings/export"
          formats={['csv', 'xlsx']}
          query={{ modelId: view.modelId, organisationId: view.organisationId }}
        />
      </div>
    </>
  );
}
