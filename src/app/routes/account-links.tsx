import { useSearchParams } from 'react-router-dom';
import { Loading } from '@/components/loading';
import { useMe } from '@/features/auth/api/get-me';
import { ConfirmEmailPage } from '@/features/auth/components/confirm-email-page';
import { PasswordResetConfirmForm } from '@/features/auth/components/password-reset-confirm-form';
import { PasswordResetRequestForm } from '@/features/auth/components/password-reset-request-form';

// Loaded lazily (see router.tsx): these pages are opened from links in mail, rarely.

export function PasswordResetRoute() {
  return <PasswordResetRequestForm />;
}

export function PasswordResetConfirmRoute() {
  const [search] = useSearchParams();
  return <PasswordResetConfirmForm token={search.get('token') || null} />;
}

export function ConfirmEmailRoute() {
  const [search] = useSearchParams();
  const me = useMe();
  if (me.isPending) return <Loading />;
  return <ConfirmEmailPage token={search.get('token') || null} signedIn={Boolean(me.data)} />;
}
