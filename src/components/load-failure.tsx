import { Alert } from '@/components/alert';
import { Button } from '@/components/button';
import { isApiError } from '@/lib/api-client';

interface LoadFailureProps {
  /** What could not be loaded, as a title: "Could not load the follow-up list". */
  title: string;
  error: unknown;
  onRetry: () => void;
}

/** A read that failed: the server's own message when it sent one, and a way to try again. */
export function LoadFailure({ title, error, onRetry }: LoadFailureProps) {
  return (
    <Alert tone="danger" title={title}>
      <p>{isApiError(error) ? error.message : 'Something went wrong.'}</p>
      <Button variant="secondary" className="mt-2" onClick={onRetry}>
        Try again
      </Button>
    </Alert>
  );
}
