import type { ReactNode } from 'react';
import { DeskAnnouncer } from './desk-announcer';
import { DeskNav } from './desk-nav';

/** Every Desk page: the section links, the live region for what was just recorded, and the page. */
export function DeskLayout({ children }: { children: ReactNode }) {
  return (
    <div className="flex flex-col gap-6">
      <DeskNav />
      <DeskAnnouncer>{children}</DeskAnnouncer>
    </div>
  );
}
