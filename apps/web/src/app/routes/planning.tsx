import { cautions } from '@emberline/contracts/cautions';
import { can } from '@emberline/contracts/permissions';
import { dueStates, type DueState } from '@emberline/contracts/planning';
import { Link, useSearchParams } from 'react-router-dom';
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
import {
  PlanningCalendar,
  type CalendarView,
} from '../../features/planning/components/planning-calendar';

const viewLabels = { list: 'List', month: 'Month', week: 'Week' } as const;

/** Today on this computer, `YYYY-MM-DD`. */
function localToday(): string {
  return new Intl.DateTimeFormat('en-CA', {
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
  }).format(new Date());
}

/** The board's address: its filters, its view and the day a calendar shows. */
function addressOf(filters: BoardFilters, view: 'list' | CalendarView, on: string) {
  const search = new URLSearchParams();
  if (filters.organisationId) search.set('customer', filters.organisationId);
  if (filters.modelId) search.set('model', filters.modelId);
  if (filters.state) search.set('state', filters.state);
  if (view !== 'list') {
    search.set('view', view);
    search.set('on', on);
  } else if (filters.page && filters.page > 1) search.set('page', String(filters.page));
  return search;
}

function PlanningScreen() {
  const user = useSignedInUser();
  const [params, setParams] = useSearchParams();
  const organisations = useOrganisations();
  const models = useEngineModels();
  const state = params.get('state');
  const viewParam = params.get('view');
  const view: 'list' | CalendarView =
    viewParam === 'month' || viewParam === 'week' ? viewParam : 'list';
  const today = localToday();
  const on = /^\d{4}-\d{2}-\d{2}$/.test(params.get('on') ?? '') ? params.get('on')! : today;
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
      <nav aria-label="Board views" className="flex gap-2">
        {(['list', 'month', 'week'] as const).map((option) => (
          <Link
            key={option}
            to={`?${addressOf(filters, option, on)}`}
            aria-current={option === view ? 'page' : undefined}
            className={`rounded-md border px-3 py-1.5 text-sm font-medium ${option === view ? 'border-ember-700 bg-ember-700 text-white' : 'border-soot-300 bg-white text-soot-900 hover:bg-soot-50'}`}
          >
            {viewLabels[option]}
          </Link>
        ))}
      </nav>
      <PlanningBoard
        calendar={
          view !== 'list' ? (
            <PlanningCalendar
              filters={{ ...filters, page: undefined }}
              view={view}
              anchor={on}
              today={today}
              onMove={(anchor) => setParams(addressOf(filters, view, anchor))}
            />
          ) : null
        }
        filters={filters}
        onFilters={(next) => setParams(addressOf(next, view, on))}
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
