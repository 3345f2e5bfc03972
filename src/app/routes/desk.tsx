import { Outlet, useParams, useSearchParams } from 'react-router-dom';
import { RequireArea } from '@/app/require-area';
import { NotFoundRoute } from '@/app/routes/not-found';
import { AuditPage } from '@/features/desk/components/audit-page';
import { DeskLayout } from '@/features/desk/components/desk-layout';
import { DeskPage } from '@/features/desk/components/desk-page';
import { SplitReviewPage } from '@/features/desk/components/split-review-page';
import { VolunteersPage } from '@/features/desk/components/volunteers-page';
import { readQueue } from '@/features/desk/lib/splits';

// Loaded lazily (see router.tsx): volunteers on the Deck never download the Desk.

/** Guards every Desk section once and keeps the section links and the live region in place between them. */
export function DeskRoute() {
  return (
    <RequireArea area="desk">
      {() => (
        <DeskLayout>
          <Outlet />
        </DeskLayout>
      )}
    </RequireArea>
  );
}

export function DeskSplitsRoute() {
  return <DeskPage />;
}

export function DeskSplitRoute() {
  const value = useParams().snippetId;
  const [search] = useSearchParams();
  const { campaign, order } = readQueue(search);
  const snippetId = value && /^\d+$/.test(value) ? Number(value) : 0;
  // The key starts each snippet with a fresh page: no note or pending ruling carries over to the next.
  return snippetId > 0 ? (
    <SplitReviewPage key={snippetId} snippetId={snippetId} queue={{ campaign, order }} />
  ) : (
    <NotFoundRoute />
  );
}

export function DeskVolunteersRoute() {
  return <VolunteersPage />;
}

export function DeskAuditRoute() {
  return <AuditPage />;
}
