import { useState } from 'react';
import { cautions } from '@emberline/contracts/cautions';
import type { ReviewQueueQuery } from '@emberline/contracts/review';
import { Notice } from '../../components/ui/notice';
import { PageHeader } from '../../components/ui/page';
import { RequirePermission } from '../../features/auth/components/require-permission';
import { useEngineModels } from '../../features/engine-models/api/engine-models';
import { useOrganisations } from '../../features/organisations/api/organisations';
import { ReviewQueue } from '../../features/review/components/review-queue';

function ReviewQueueScreen() {
  const [query, setQuery] = useState<ReviewQueueQuery>({});
  const organisations = useOrganisations();
  const models = useEngineModels();
  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="Review queue"
        description="Submitted inspections waiting for an engineer: the worst verdict first, then the longest waiting."
      />
      <Notice tone="caution">{cautions.dispositions}</Notice>
      <ReviewQueue
        query={query}
        onQuery={setQuery}
        customers={(organisations.data ?? [])
          .filter((organisation) => organisation.kind === 'customer')
          .map((organisation) => ({ id: organisation.id, label: organisation.name }))}
        models={(models.data ?? []).map((model) => ({
          id: model.id,
          label: `${model.name} v${model.version}`,
        }))}
      />
    </div>
  );
}

export function ReviewQueueRoute() {
  return (
    <RequirePermission permission="review:inspection">
      <ReviewQueueScreen />
    </RequirePermission>
  );
}
