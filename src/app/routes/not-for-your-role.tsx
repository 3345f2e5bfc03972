import { ButtonLink } from '@/components/button';
import { EmptyState } from '@/components/empty-state';
import { type Area, areaByKey } from '@/config/areas';
import { type Person, roleLabels, roles } from '@/lib/person';

function listRoles(area: Area): string {
  const allowed = roles
    .slice(roles.indexOf(area.minRole))
    .map((role) => `${roleLabels[role].toLowerCase()}s`);
  if (allowed.length === 1) return allowed[0] ?? '';
  return `${allowed.slice(0, -1).join(', ')} and ${allowed.at(-1)}`;
}

export function NotForYourRole({ area, person }: { area: Area; person: Person }) {
  const deck = areaByKey('deck');
  return (
    <div className="mx-auto flex max-w-2xl flex-col gap-6">
      <EmptyState
        title={`${capitalise(area.inSentence)} is not for your role`}
        action={<ButtonLink to={deck.href}>Go to the Deck</ButtonLink>}
      >
        <p>
          {capitalise(area.inSentence)} is for {listRoles(area)}. You are signed in as {person.displayName},
          with the role{' '}
          <strong className="font-semibold text-ink">{roleLabels[person.role].toLowerCase()}</strong>. If you
          think you should have access, ask an admin of your team.
        </p>
      </EmptyState>
    </div>
  );
}

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
