import { Link, isRouteErrorResponse, useRouteError } from 'react-router-dom';
import { EmptyState, ErrorState } from '@/components/ui';
import { paths } from '@/config/paths';

export function RouteErrorPage() {
  const error = useRouteError();
  const message = isRouteErrorResponse(error) ? `${error.status} ${error.statusText}` : error instanceof Error ? error.message : 'Unknown error';
  return (
    <div className="p-6">
      <ErrorState error={message} onRetry={() => window.location.reload()} />
    </div>
  );
}

export function NotFoundPage() {
  return (
    <EmptyState
      title="Nothing here"
      message="That page does not exist, or you do not have access to it."
      action={<Link className="text-accent underline" to={paths.home}>Go to the start page</Link>}
    />
  );
}
