import { Link, isRouteErrorResponse, useRouteError } from 'react-router-dom';
import { EmptyState, ErrorState } from '@/components/ui';
import { paths } from '@/config/paths';
import { ApiError } from '@/lib/api-client';
import { NotForYourRole } from '@/lib/auth';
import { usePageTitle } from '@/lib/page-title';

/** A refusal (403) is no passing failure: the page says whose it is instead of offering a retry. */
function isRefusal(error: unknown): boolean {
  return (error instanceof ApiError && error.status === 403) || (isRouteErrorResponse(error) && error.status === 403);
}

export function RouteErrorPage() {
  const error = useRouteError();
  if (isRefusal(error)) {
    return (
      <div className="p-6">
        <NotForYourRole />
      </div>
    );
  }
  return <BrokenPage error={error} />;
}

function BrokenPage({ error }: { error: unknown }) {
  usePageTitle('Something went wrong', null);
  const message = isRouteErrorResponse(error) ? `${error.status} ${error.statusText}` : error instanceof Error ? error.message : 'Unknown error';
  return (
    <div className="p-6">
      <ErrorState error={message} onRetry={() => window.location.reload()} />
    </div>
  );
}

export function NotFoundPage() {
  usePageTitle('Not found');
  return (
    <EmptyState
      headingLevel={1}
      title="Nothing here"
      message="That page does not exist, or you do not have access to it."
      action={<Link className="text-accent underline" to={paths.home}>Go to the start page</Link>}
    />
  );
}
