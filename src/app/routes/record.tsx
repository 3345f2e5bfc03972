import { useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { Navigate } from 'react-router-dom';
import { RequireArea } from '@/app/require-area';
import { paths } from '@/config/paths';
import { forgetSignedInPerson, markSignedOutOnPurpose } from '@/features/auth/api/sign-out';
import { RecordPage } from '@/features/record/components/record-page';
import { homeNotice } from './home';

const deletedNotice = homeNotice(
  'Your account is deleted and you are signed out. Your verdicts stay in the science record, without your name. Thank you for your help.',
);

export function RecordRoute() {
  const queryClient = useQueryClient();
  const [deleted, setDeleted] = useState(false);

  // Rendered instead of the guard, which would otherwise redirect home without the news once the person
  // is forgotten.
  if (deleted) return <Navigate to={paths.home.getHref()} replace state={deletedNotice} />;

  function accountDeleted() {
    markSignedOutOnPurpose();
    setDeleted(true);
    forgetSignedInPerson(queryClient);
  }

  return (
    <RequireArea area="record">
      {(person) => <RecordPage person={person} onAccountDeleted={accountDeleted} />}
    </RequireArea>
  );
}
