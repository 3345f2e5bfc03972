import { useLocation } from 'react-router-dom';
import { ButtonLink } from '@/components/button';
import { EmptyState } from '@/components/empty-state';
import { paths } from '@/config/paths';

export function NotFoundRoute() {
  const location = useLocation();
  return (
    <div className="mx-auto flex max-w-2xl flex-col gap-6">
      <p className="tabular text-sm text-amber-ink">404 · page not found</p>
      <EmptyState
        title="Nothing at this address"
        action={<ButtonLink to={paths.home.getHref()}>Back to the start</ButtonLink>}
      >
        <p>
          There is no page at <code className="tabular break-all text-ink">{location.pathname}</code>. The
          link may be old, or the address mistyped.
        </p>
      </EmptyState>
    </div>
  );
}
