import type { Role } from '../../auth/roles';
import type { PersonRow } from '../../db/people';

/** What the API says about a person to that person and to admins. */
export interface PersonView {
  id: number;
  email: string;
  displayName: string;
  role: Role;
  suspended: boolean;
  newsletterOptIn: boolean;
  creditByName: boolean;
  /** Whether the person followed the link in the address-confirmation mail. */
  emailConfirmed: boolean;
  createdAt: string;
}

export function toPersonView(person: PersonRow): PersonView {
  return {
    id: person.id,
    email: person.email ?? '',
    displayName: person.displayName,
    role: person.role,
    suspended: person.suspendedAt !== null,
    newsletterOptIn: person.newsletterOptIn,
    creditByName: person.creditByName,
    emailConfirmed: person.emailConfirmedAt !== null,
    createdAt: person.createdAt,
  };
}
