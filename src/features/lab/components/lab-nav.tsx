import { Link, useLocation } from 'react-router-dom';
import { paths } from '@/config/paths';

const sections = [
  {
    label: 'Campaigns',
    href: paths.lab.getHref(),
    // A campaign, its snippets and its targets all belong under Campaigns.
    matches: (pathname: string) =>
      pathname === paths.lab.path ||
      pathname.startsWith('/lab/campaigns') ||
      pathname.startsWith('/lab/targets'),
  },
  {
    label: 'API tokens',
    href: paths.labTokens.getHref(),
    matches: (pathname: string) => pathname.startsWith(paths.labTokens.path),
  },
  {
    label: 'API reference',
    href: paths.labApiReference.getHref(),
    matches: (pathname: string) => pathname.startsWith(paths.labApiReference.path),
  },
] as const;

/** The Lab's own sections, as links so each has an address to share and reload. */
export function LabNav() {
  const { pathname } = useLocation();
  return (
    <nav aria-label="Lab sections">
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
