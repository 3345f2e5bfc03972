import { Navigate, Outlet, useOutletContext, useParams, useSearchParams } from 'react-router-dom';
import { RequireArea } from '@/app/require-area';
import { paths } from '@/config/paths';
import { AdminNav } from '@/features/admin/components/admin-nav';
import { OutboxAdmin } from '@/features/admin/components/outbox-admin';
import { OutboxMessagePage } from '@/features/admin/components/outbox-message';
import { PeopleAdmin } from '@/features/admin/components/people-admin';
import { QueuesAdmin } from '@/features/admin/components/queues-admin';
import type { Person } from '@/lib/person';

// Loaded lazily (see router.tsx): volunteers on the Deck never download Admin.

/** Guards every Admin section once and keeps the section links in place while moving between them. */
export function AdminRoute() {
  return (
    <RequireArea area="admin">
      {(person) => (
        <div className="flex flex-col gap-6">
          <AdminNav />
          <Outlet context={person} />
        </div>
      )}
    </RequireArea>
  );
}

// The Admin link in the main navigation points at /admin; People is where an admin usually starts.
export function AdminIndexRoute() {
  return <Navigate to={paths.adminPeople.getHref()} replace />;
}

export function AdminPeopleRoute() {
  const person = useOutletContext<Person>();
  return <PeopleAdmin currentPersonId={person.id} />;
}

export function AdminQueuesRoute() {
  return <QueuesAdmin />;
}

/** The page lives in the address, so Back from a message returns to the page it was opened from. */
export function AdminOutboxRoute() {
  const [search, setSearch] = useSearchParams();
  const asked = Number(search.get('page') ?? 1);
  const page = Number.isInteger(asked) && asked >= 1 ? asked : 1;
  return (
    <OutboxAdmin
      page={page}
      onPage={(next) =>
        setSearch((current) => {
          const updated = new URLSearchParams(current);
          if (next > 1) updated.set('page', String(next));
          else updated.delete('page');
          return updated;
        })
      }
    />
  );
}

export function AdminOutboxMessageRoute() {
  const { messageId } = useParams();
  const id = Number(messageId);
  if (!Number.isInteger(id) || id < 1) return <Navigate to={paths.adminOutbox.getHref()} replace />;
  // Keyed, so moving to another message starts from that message's own default view.
  return <OutboxMessagePage key={id} messageId={id} />;
}
