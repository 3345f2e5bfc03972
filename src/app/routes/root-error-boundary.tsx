import { isRouteErrorResponse, useRouteError } from 'react-router-dom';
import { Button } from '@/components/button';
import { Wordmark } from '@/components/logo';

/** The last line of defence: shown instead of the whole app when rendering or routing throws. */
export function RootErrorBoundary() {
  const error = useRouteError();
  const detail = isRouteErrorResponse(error)
    ? `${error.status} ${error.statusText}`
    : error instanceof Error
      ? error.message
      : 'Unknown error';

  return (
    <div className="mx-auto flex min-h-dvh max-w-xl flex-col justify-center gap-6 px-5 py-12">
      <Wordmark />
      <div className="flex flex-col gap-3 rounded-lg border border-line bg-surface p-6">
        <h1 className="text-2xl font-semibold">Something went wrong</h1>
        <p className="text-muted">
          Dipdeck hit a problem it did not expect. What you already sent is safe on the server; reloading the
          page usually helps.
        </p>
        <p className="tabular break-all rounded-md bg-paper px-3 py-2 text-sm text-slate">{detail}</p>
        <div>
          <Button onClick={() => window.location.reload()}>Reload the page</Button>
        </div>
      </div>
    </div>
  );
}
