import { type Section, SectionNav } from '@/components/section-nav';
import { paths } from '@/config/paths';

const sections = [
  {
    label: 'Campaigns',
    href: paths.lab.getHref(),
    // A campaign, its snippets, targets, candidates and follow-up list all belong under Campaigns.
    matches: (pathname: string) =>
      pathname === paths.lab.path ||
      pathname.startsWith('/lab/campaigns') ||
      pathname.startsWith('/lab/targets') ||
      pathname.startsWith('/lab/candidates'),
  },
  {
    label: 'Observatories',
    href: paths.labObservatories.getHref(),
    matches: (pathname: string) => pathname.startsWith(paths.labObservatories.path),
  },
  {
    label: 'Newsletters',
    href: paths.labNewsletters.getHref(),
    matches: (pathname: string) => pathname.startsWith(paths.labNewsletters.path),
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
] satisfies Section[];

export function LabNav() {
  return <SectionNav label="Lab sections" sections={sections} />;
}
