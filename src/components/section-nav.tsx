import { Link, useLocation } from 'react-router-dom';

export interface Section {
  label: string;
  href: string;
  /** Whether the current path belongs under this section (a list and the pages opened from it). */
  matches: (pathname: string) => boolean;
}

/** An area's own sections (the Lab's, the Desk's), as links so each has an address to share and reload. */
export function SectionNav({ label, sections }: { label: string; sections: readonly Section[] }) {
  const { pathname } = useLocation();
  return (
    <nav aria-label={label}>
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
