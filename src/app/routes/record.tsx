import { RequireArea } from '@/app/require-area';
import { RecordPage } from '@/features/record/components/record-page';

export function RecordRoute() {
  return <RequireArea area="record">{(person) => <RecordPage person={person} />}</RequireArea>;
}
