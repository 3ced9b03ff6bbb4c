import { OrganisationsView } from '../../../features/organisations/components/organisations-view';

export function AdminOrganisationsRoute() {
  return <OrganisationsView />;
}
