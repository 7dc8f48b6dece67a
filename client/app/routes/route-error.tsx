import { isRouteErrorResponse, Link, useRouteError } from 'react-router-dom';
import { Card, PageTitle } from '@client/components/ui/card';
import { ApiError } from '@client/lib/api-client';

/** Shown when a route fails to load or render; keeps the layout around it. */
export function RouteError() {
  const error = useRouteError();
  const message =
    error instanceof ApiError
      ? error.message
      : isRouteErrorResponse(error)
        ? `${error.status} ${error.statusText}`
        : 'Something went wrong while showing this page.';
  return (
    <div className="mx-auto max-w-lg">
      <PageTitle title="This page could not be shown" lead={message} />
      <Card className="flex gap-4">
        <button type="button" className="font-semibold text-slate-700 underline underline-offset-4" onClick={() => window.location.reload()}>
          Try again
        </button>
        <Link to="/" className="font-semibold text-slate-700 underline underline-offset-4">
          Front page
        </Link>
      </Card>
    </div>
  );
}
