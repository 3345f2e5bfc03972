import { paths } from '@/config/paths';
import type { Role } from '@/lib/person';

export type AreaKey = 'deck' | 'record' | 'desk' | 'lab' | 'admin';

export interface Area {
  key: AreaKey;
  label: string;
  href: string;
  /** The least able role that may use the area; every role above it may too. */
  minRole: Role;
  summary: string;
}

export const areas: readonly Area[] = [
  { key: 'deck', label: 'Deck', href: paths.deck.getHref(), minRole: 'volunteer', summary: 'Judge snippets' },
  {
    key: 'record',
    label: 'My record',
    href: paths.record.getHref(),
    minRole: 'volunteer',
    summary: 'Your account and verdicts',
  },
  { key: 'desk', label: 'Desk', href: paths.desk.getHref(), minRole: 'moderator', summary: 'Settle split snippets' },
  { key: 'lab', label: 'Lab', href: paths.lab.getHref(), minRole: 'scientist', summary: 'Run campaigns' },
  { key: 'admin', label: 'Admin', href: paths.admin.getHref(), minRole: 'admin', summary: 'People and roles' },
];

export function areaByKey(key: AreaKey): Area {
  const area = areas.find((candidate) => candidate.key === key);
  if (!area) throw new Error(`key must name an area, got ${key}`);
  return area;
}
