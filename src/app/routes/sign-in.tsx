import { Navigate, useNavigate, useSearchParams } from 'react-router-dom';
import { Loading } from '@/components/loading';
import { paths, safeRedirect } from '@/config/paths';
import { useMe } from '@/features/auth/api/get-me';
import { SignInForm } from '@/features/auth/components/sign-in-form';

export function SignInRoute() {
  const [search] = useSearchParams();
  const navigate = useNavigate();
  const me = useMe();
  const redirectTo = search.get('redirectTo') ?? undefined;
  const destination = safeRedirect(redirectTo, paths.deck.getHref());

  if (me.isPending) return <Loading />;
  if (me.data) return <Navigate to={destination} replace />;
  return <SignInForm redirectTo={redirectTo} onSignedIn={() => navigate(destination, { replace: true })} />;
}
