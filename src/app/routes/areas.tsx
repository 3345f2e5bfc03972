import { RequireArea } from '@/app/require-area';
import { PeopleAdmin } from '@/features/admin/components/people-admin';
import { DeckPage } from '@/features/deck/components/deck-page';
import { DeskPage } from '@/features/desk/components/desk-page';
import { LabPage } from '@/features/lab/components/lab-page';
import { RecordPage } from '@/features/record/components/record-page';

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

export function AdminRoute() {
  return <RequireArea area="admin">{(person) => <PeopleAdmin currentPersonId={person.id} />}</RequireArea>;
}
