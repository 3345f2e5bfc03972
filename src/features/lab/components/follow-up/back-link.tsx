import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';

export function BackLink({ to, children }: { to: string; children: ReactNode }) {
  return (
    <Link
      to={to}
      className="inline-flex min-h-target items-center gap-1.5 self-start rounded-md pr-3 text-sm font-medium text-muted hover:text-ink"
    >
      <span aria-hidden="true">←</span> {children}
    </Link>
  );
}
