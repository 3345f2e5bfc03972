import { Navigate, Outlet, useOutletContext } from 'react-router-dom';
import { RequireArea } from '@/app/require-area';
import { paths } from '@/config/paths';
import { AdminNav } from '@/features/admin/components/admin-nav';
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
