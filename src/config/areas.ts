import { paths } from '@/config/paths';
import type { Role } from '@/lib/person';

export type AreaKey = 'deck' | 'record' | 'desk' | 'lab' | 'admin';

export interface Area {
  key: AreaKey;
  label: string;
  /** How the area is named inside a sentence: "the Desk", but "Admin" and "My record". */
  inSentence: string;
  href: string;
  /** The least able role that may use the area; every role above it may too. */
  minRole: Role;
}

export const areas: readonly Area[] = [
  {
    key: 'deck',
    inSentence: 'the Deck',
    label: 'Deck',
    href: paths.deck.getHref(),
    minRole: 'volunteer',
  },
  {
    key: 'record',
    inSentence: 'My record',
    label: 'My record',
    href: paths.record.getHref(),
    minRole: 'volunteer',
  },
  {
    key: 'desk',
    inSentence: 'the Desk',
    label: 'Desk',
    href: paths.desk.getHref(),
    minRole: 'moderator',
  },
  {
    key: 'lab',
    inSentence: 'the Lab',
    label: 'Lab',
    href: paths.lab.getHref(),
    minRole: 'scientist',
  },
  {
    key: 'admin',
    inSentence: 'Admin',
    label: 'Admin',
    href: paths.admin.getHref(),
    minRole: 'admin',
  },
];

export function areaByKey(key: AreaKey): Area {
  const area = areas.find((candidate) => candidate.key === key);
  if (!area) throw new Error(`key must name an area, got ${key}`);
  return area;
}
