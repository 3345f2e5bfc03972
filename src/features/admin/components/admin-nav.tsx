import { NavLink } from 'react-router-dom';
import { paths } from '@/config/paths';

const sections = [
  { label: 'People', href: paths.adminPeople.getHref() },
  { label: 'Queues', href: paths.adminQueues.getHref() },
  { label: 'Outbox', href: paths.adminOutbox.getHref() },
] as const;

/** Admin's own sections: links rather than tabs, so each section has an address to share and reload. */
export function AdminNav() {
  return (
    <nav aria-label="Admin sections">
      <ul className="inline-flex gap-1 rounded-lg border border-line bg-surface p-1">
        {sections.map((section) => (
          <li key={section.href}>
            <NavLink
              to={section.href}
              className={({ isActive }) =>
                `flex min-h-target min-w-24 items-center justify-center rounded-md px-4 text-base font-medium transition-colors ${
                  isActive ? 'bg-ink text-paper' : 'text-muted hover:bg-amber-wash hover:text-ink'
                }`
              }
            >
              {section.label}
            </NavLink>
          </li>
        ))}
      </ul>
    </nav>
  );
}
