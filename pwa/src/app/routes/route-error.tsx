import { isRouteErrorResponse, Link, useRouteError } from 'react-router-dom';
import { Notice } from '../../components/ui/notice.js';
import { AppShell } from './app-layout.js';

/** Root error boundary: keeps the shell and says what went wrong. */
export function RouteError() {
  const error = useRouteError();
  const message = isRouteErrorResponse(error)
    ? `${error.status} ${error.statusText}`
    : error instanceof Error
      ? error.message
      : String(error);
  return (
    <AppShell>
      <title>Error · Phasewright</title>
      <Notice tone="error" title="This page failed to load">
        <p>{message}</p>
        <p className="mt-2">
          <Link to="/" className="font-semibold underline">
            Back to the start page
          </Link>
        </p>
      </Notice>
    </AppShell>
  );
}
