import { isRouteErrorResponse, useRouteError } from 'react-router-dom';

/** Shown when a page fails to load or render, instead of a blank screen. */
export function RouteErrorPage() {
  const error = useRouteError();
  const message = isRouteErrorResponse(error)
    ? `${error.status} ${error.statusText}`
    : error instanceof Error
      ? error.message
      : 'Unknown error';
  return (
    <div role="alert" className="m-8 rounded-lg border border-danger/50 bg-panel p-8">
      <h1 className="text-2xl font-semibold">This page could not be shown</h1>
      <p className="mt-2 text-muted">{message}</p>
      <button type="button" onClick={() => window.location.reload()} className="mt-4 text-accent underline">
        Reload
      </button>
    </div>
  );
}
