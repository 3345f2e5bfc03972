import { type Section, SectionNav } from '@/components/section-nav';
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
] satisfies Section[];

export function DeskNav() {
  return <SectionNav label="Desk sections" sections={sections} />;
}
