import { cautions } from '@emberline/contracts/cautions';
import { can } from '@emberline/contracts/permissions';
import { dueStates, type DueState } from '@emberline/contracts/planning';
import { useSearchParams } from 'react-router-dom';
import { Notice } from '../../components/ui/notice';
import { PageHeader } from '../../components/ui/page';
import { RequirePermission } from '../../features/auth/components/require-permission';
import { useSignedInUser } from '../../features/auth/hooks/use-signed-in-user';
import { useEngineModels } from '../../features/engine-models/api/engine-models';
import { useOrganisations } from '../../features/organisations/api/organisations';
import {
  PlanningBoard,
  type BoardFilters,
} from '../../features/planning/components/planning-board';

function PlanningScreen() {
  const user = useSignedInUser();
  const [params, setParams] = useSearchParams();
  const organisations = useOrganisations();
  const models = useEngineModels();
  const state = params.get('state');
  // The filters live in the address, so that a view can be shared and the back button works.
  const filters: BoardFilters = {
    organisationId: params.get('customer') ?? undefined,
    modelId: params.get('model') ?? undefined,
    state: dueStates.includes(state as DueState) ? (state as DueState) : undefined,
    page: Number(params.get('page') ?? 1) || 1,
  };
  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="Planning board"
        description="When each engine is next due, overdue first: book the inspections before they fall due."
      />
      <Notice tone="caution">{cautions.short}</Notice>
      <PlanningBoard
        filters={filters}
        onFilters={(next) => {
          const search = new URLSearchParams();
          if (next.organisationId) search.set('customer', next.organisationId);
          if (next.modelId) search.set('model', next.modelId);
          if (next.state) search.set('state', next.state);
          if (next.page && next.page > 1) search.set('page', String(next.page));
          setParams(search);
        }}
        customers={(organisations.data ?? [])
          .filter((organisation) => organisation.kind === 'customer')
          .map((organisation) => ({ id: organisation.id, label: organisation.name }))}
        models={(models.data ?? []).map((model) => ({
          id: model.id,
          label: `${model.name} v${model.version}`,
        }))}
        canBook={can(user.role, 'plan:inspection')}
      />
    </div>
  );
}

export function PlanningRoute() {
  return (
    <RequirePermission permission="read:planning">
      <PlanningScreen />
    </RequirePermission>
  );
}
