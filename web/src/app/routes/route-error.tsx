import { isRouteErrorResponse, Link, useRouteError } from 'react-router';
import { ErrorPanel } from '../../components/ui/error-panel';

/** Shown when a screen fails to load or throws: says so plainly and offers a way back. */
export function RouteError() {
  const error = useRouteError();
  const detail = isRouteErrorResponse(error)
    ? `${error.status} ${error.statusText}`
    : error instanceof Error
      ? error.message
      : 'Unknown error';
  return (
    <div className="mx-auto max-w-xl p-8">
      <ErrorPanel
        title="This screen could not be shown"
        action={
          <Link to="/" className="font-medium text-tide-600 underline">
            Back to Ebbline
          </Link>
        }
      >
        {detail}. Reload the page; if it keeps happening, tell your admin.
      </ErrorPanel>
    </div>
  );
}
