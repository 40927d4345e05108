import { Link, isRouteErrorResponse, useRouteError } from 'react-router-dom';

export function RouteError() {
  const error = useRouteError();
  const message = isRouteErrorResponse(error)
    ? `${error.status} ${error.statusText}`
    : error instanceof Error
      ? error.message
      : 'Something went wrong';
  return (
    <div className="mx-auto max-w-lg p-8">
      <h1 className="text-xl font-bold">This page could not be shown</h1>
      <p className="mt-2 text-ink-soft">{message}</p>
      <Link className="mt-4 inline-block font-semibold text-accent underline" to="/">
        Back to projects
      </Link>
    </div>
  );
}

export function NotFound() {
  return (
    <div className="mx-auto max-w-lg p-8">
      <h1 className="text-xl font-bold">No such page</h1>
      <Link className="mt-4 inline-block font-semibold text-accent underline" to="/">
        Back to projects
      </Link>
    </div>
  );
}
