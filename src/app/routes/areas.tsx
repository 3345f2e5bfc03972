import { Navigate, Outlet, useOutletContext } from 'react-router-dom';
import { RequireArea } from '@/app/require-area';
import { paths } from '@/config/paths';
import { AdminNav } from '@/features/admin/components/admin-nav';
import { PeopleAdmin } from '@/features/admin/components/people-admin';
import { QueuesAdmin } from '@/features/admin/components/queues-admin';
import { DeckPage } from '@/features/deck/components/deck-page';
import { DeskPage } from '@/features/desk/components/desk-page';
import { LabPage } from '@/features/lab/components/lab-page';
import { RecordPage } from '@/features/record/components/record-page';
import type { Person } from '@/lib/person';

export function DeckRoute() {
  return <RequireArea area="deck">{() => <DeckPage />}</RequireArea>;
}

export function RecordRoute() {
  return <RequireArea area="record">{(person) => <RecordPage person={person} />}</RequireArea>;
}

export function DeskRoute() {
  return <RequireArea area="desk">{() => <DeskPage />}</RequireArea>;
}

export function LabRoute() {
  return <RequireArea area="lab">{() => <LabPage />}</RequireArea>;
}

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
