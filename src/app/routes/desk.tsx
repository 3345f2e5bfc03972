import { RequireArea } from '@/app/require-area';
import { DeskPage } from '@/features/desk/components/desk-page';

export function DeskRoute() {
  return <RequireArea area="desk">{() => <DeskPage />}</RequireArea>;
}
