import { useEffect, useId, useState } from 'react';
import { Link, NavLink, Outlet, useLocation, useNavigate } from 'react-router-dom';
import { Button, ButtonLink } from '@/components/button';
import { Wordmark } from '@/components/logo';
import { areas } from '@/config/areas';
import { paths } from '@/config/paths';
import { useMe } from '@/features/auth/api/get-me';
import { useSignOut } from '@/features/auth/api/sign-out';
import { hasRole, type Person, roleLabels } from '@/lib/person';

export function AppLayout() {
  const me = useMe();
  const person = me.data ?? null;

  return (
    <div className="flex min-h-dvh flex-col">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:fixed focus:top-2 focus:left-2 focus:z-50 focus:rounded-md focus:bg-ink focus:px-4 focus:py-3 focus:text-paper"
      >
        Skip to content
      </a>
      <header className="sticky top-0 z-30 border-b border-line bg-paper/95 backdrop-blur-sm">
        <div className="mx-auto flex h-16 max-w-6xl items-center gap-4 px-4 lg:px-6">
          <Link
            to={paths.home.getHref()}
            className="flex min-h-target items-center rounded-md"
            aria-label="Dipdeck, home"
          >
            <Wordmark />
          </Link>
          {me.isPending ? null : person ? <SignedInNav person={person} /> : <SignedOutActions />}
        </div>
      </header>
      <main id="main" className="mx-auto w-full max-w-6xl flex-1 px-4 py-8 lg:px-6 lg:py-12">
        <Outlet />
      </main>
      <footer className="border-t border-line">
        <div className="mx-auto flex max-w-6xl flex-col gap-1 px-4 py-6 text-sm text-muted lg:flex-row lg:justify-between lg:px-6">
          <p>Dipdeck: volunteers and astronomers looking for planets, one snippet at a time.</p>
          <p>All demo accounts and light curves are invented.</p>
        </div>
      </footer>
    </div>
  );
}

function SignedOutActions() {
  const location = useLocation();
  // Someone reading the home page has no page to be sent back to.
  const redirectTo = location.pathname === paths.home.path ? undefined : location.pathname;
  return (
    <div className="ml-auto flex items-center gap-2">
      {location.pathname === paths.signIn.path ? null : (
        <ButtonLink variant="quiet" to={paths.signIn.getHref(redirectTo)}>
          Sign in
        </ButtonLink>
      )}
      {location.pathname === paths.signUp.path ? null : (
        <ButtonLink variant="primary" to={paths.signUp.getHref(redirectTo)}>
          Sign up
        </ButtonLink>
      )}
    </div>
  );
}

function SignedInNav({ person }: { person: Person }) {
  const [open, setOpen] = useState(false);
  const menuId = useId();
  const location = useLocation();
  const navigate = useNavigate();
  const signOut = useSignOut();
  const visible = areas.filter((area) => hasRole(person, area.minRole));

  // A new page means the phone menu has done its job.
  useEffect(() => {
    if (location.pathname) setOpen(false);
  }, [location.pathname]);

  useEffect(() => {
    if (!open) return;
    const closeOnEscape = (event: KeyboardEvent) => {
      if (event.key === 'Escape') setOpen(false);
    };
    document.addEventListener('keydown', closeOnEscape);
    return () => document.removeEventListener('keydown', closeOnEscape);
  }, [open]);

  return (
    <>
      <Button
        variant="secondary"
        className="ml-auto lg:hidden"
        aria-expanded={open}
        aria-controls={menuId}
        onClick={() => setOpen((value) => !value)}
      >
        <svg
          aria-hidden="true"
          viewBox="0 0 20 20"
          className="size-5"
          fill="none"
          stroke="currentColor"
          strokeWidth="2"
        >
          {open ? <path d="M5 5l10 10M15 5L5 15" /> : <path d="M3 6h14M3 10h14M3 14h14" />}
        </svg>
        Menu
      </Button>
      <div
        id={menuId}
        className={`${open ? 'flex' : 'hidden'} absolute inset-x-0 top-16 flex-col gap-4 border-b border-line bg-paper px-4 pt-2 pb-5 shadow-[0_16px_24px_-20px_rgb(29_35_48/0.5)] lg:static lg:ml-2 lg:flex lg:flex-1 lg:flex-row lg:items-center lg:border-0 lg:bg-transparent lg:p-0 lg:shadow-none`}
      >
        <nav aria-label="Main" className="lg:flex-1">
          <ul className="flex flex-col lg:flex-row lg:gap-1">
            {visible.map((area) => (
              <li key={area.key}>
                <NavLink
                  to={area.href}
                  className={({ isActive }) =>
                    `relative flex min-h-target items-center rounded-md px-3 text-base font-medium transition-colors hover:bg-amber-wash ${
                      isActive
                        ? 'text-ink after:absolute after:inset-y-2 after:left-0 after:w-[3px] after:rounded-full after:bg-amber lg:after:inset-x-3 lg:after:inset-y-auto lg:after:-bottom-[11px] lg:after:h-[3px] lg:after:w-auto'
                        : 'text-muted hover:text-ink'
                    }`
                  }
                >
                  {area.label}
                </NavLink>
              </li>
            ))}
          </ul>
        </nav>
        <div className="flex items-center justify-between gap-3 border-t border-line pt-4 lg:border-0 lg:pt-0">
          <p className="flex flex-col leading-tight lg:text-right">
            <span className="text-sm font-medium text-ink">{person.displayName}</span>
            <span className="tabular text-xs text-muted">{roleLabels[person.role].toLowerCase()}</span>
          </p>
          <Button
            variant="secondary"
            busy={signOut.isPending}
            onClick={() => signOut.mutate(undefined, { onSuccess: () => navigate(paths.home.getHref()) })}
          >
            Sign out
          </Button>
        </div>
      </div>
    </>
  );
}
