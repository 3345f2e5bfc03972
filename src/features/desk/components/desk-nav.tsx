import { Link, useLocation } from 'react-router-dom';
import { paths } from '@/config/paths';

const sections = [
  {
    label: 'Splits',
    href: paths.desk.getHref(),
    // The queue and every review in it belong under Splits.
    matches: (pathname: string) => pathname === paths.desk.path || pathname.startsWith('/desk/splits'),
  },
  {
    label: 'Volunteers',
    href: paths.deskVolunteers.getHref(),
    matches: (pathname: string) => pathname.startsWith(paths.deskVolunteers.path),
  },
  {
    label: 'Audit log',
    href: paths.deskAudit.getHref(),
    matches: (pathname: string) => pathname.startsWith(paths.deskAudit.path),
  },
] as const;

/** The Desk's own sections, as links so each has an address to share and reload. */
export function DeskNav() {
  const { pathname } = useLocation();
  return (
    <nav aria-label="Desk sections">
      <ul className="grid grid-cols-3 gap-1 rounded-lg border border-line bg-surface p-1 sm:inline-grid sm:auto-cols-max sm:grid-flow-col">
        {sections.map((section) => {
          const active = section.matches(pathname);
          const exact = pathname === section.href;
          return (
            <li key={section.href}>
              <Link
                to={section.href}
                aria-current={exact ? 'page' : active ? 'location' : undefined}
                className={`flex min-h-target items-center justify-center rounded-md px-2 text-center text-sm leading-tight font-medium transition-colors sm:min-w-24 sm:px-4 sm:text-base ${
                  active ? 'bg-ink text-paper' : 'text-muted hover:bg-amber-wash hover:text-ink'
                }`}
              >
                {section.label}
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
