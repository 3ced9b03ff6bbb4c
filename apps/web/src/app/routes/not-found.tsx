import { Link } from 'react-router-dom';
import { PageHeader } from '../../components/ui/page';

export function NotFoundRoute() {
  return (
    <>
      <PageHeader
        title="Page not found"
        description="There is no page at this address, or it is not shared with you."
      />
      <Link to="/" className="text-sm font-medium text-ember-700 hover:underline">
        Go to the start page
      </Link>
    </>
  );
}
