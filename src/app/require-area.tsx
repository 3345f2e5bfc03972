import type { ReactNode } from 'react';
import { Navigate, useLocation } from 'react-router-dom';
import { NotForYourRole } from '@/app/routes/not-for-your-role';
import { Alert } from '@/components/alert';
import { Loading } from '@/components/loading';
import { type AreaKey, areaByKey } from '@/config/areas';
import { paths } from '@/config/paths';
import { useMe } from '@/features/auth/api/get-me';
import { signedOutJustNow } from '@/features/auth/api/sign-out';
import { hasRole, type Person } from '@/lib/person';

interface RequireAreaProps {
  area: AreaKey;
  children: (person: Person) => ReactNode;
}

/** Lets a person into an area only when signed in with a role that may use it. */
export function RequireArea({ area, children }: RequireAreaProps) {
  const me = useMe();
  const location = useLocation();

  if (me.isPending) return <Loading label="Checking your account…" />;
  if (me.isError) {
    return (
      <Alert tone="danger" title="Could not check your account">
        {me.error.message}
      </Alert>
    );
  }
  if (!me.data) {
    // Signing out on a protected page leads home, not to the sign-in form.
    if (signedOutJustNow()) return <Navigate to={paths.home.getHref()} replace />;
    return <Navigate to={paths.signIn.getHref(`${location.pathname}${location.search}`)} replace />;
  }
  const target = areaByKey(area);
  if (!hasRole(me.data, target.minRole)) return <NotForYourRole area={target} person={me.data} />;
  return <>{children(me.data)}</>;
}
