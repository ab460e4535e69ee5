import { isRouteErrorResponse, Link, useRouteError } from 'react-router';
import { Alert } from '@/components/ui/alert';
import { paths } from '@/lib/paths';

export function RouteError() {
  const error = useRouteError();
  const message = isRouteErrorResponse(error) ? `${error.status} ${error.statusText}` : 'This page ran into a problem.';
  return (
    <div className="mx-auto max-w-xl p-6">
      <Alert tone="error" title="Something went wrong">
        <p>{message} Reload the page to try again; nothing saved is lost.</p>
        <p className="mt-2">
          <Link className="underline" to={paths.guilds}>
            Back to your guilds
          </Link>
        </p>
      </Alert>
    </div>
  );
}
