import { z } from 'zod';
import { ROLES } from '../../auth/roles';
import { changePerson } from '../../services/people/change-person';
import { listPeople } from '../../services/people/list-people';
import { toPersonView } from '../../services/people/person-view';
import type { AppDeps } from '../app-deps';
import { defineRoute } from '../define-route';
import { idParams, pagination } from '../schemas';

const peopleQuery = z.object({
  q: z.string().trim().max(100).optional(),
  role: z.enum(ROLES).optional(),
  ...pagination.shape,
});

const personChange = z
  .object({
    role: z.enum(ROLES).optional(),
    suspended: z.boolean().optional(),
    reason: z.string().trim().max(500).optional(),
  })
  .strict()
  .refine((change) => change.role !== undefined || change.suspended !== undefined, {
    message: 'Give a role, suspended, or both',
    path: ['role'],
  });

export const adminPeopleRoutes = (deps: AppDeps) => [
  defineRoute({
    method: 'get',
    path: '/admin/people',
    access: 'admin',
    summary: 'List people, with search by name or e-mail and a role filter',
    query: peopleQuery,
    handle: async ({ query }) => listPeople(deps.db, query),
  }),
  defineRoute({
    method: 'patch',
    path: '/admin/people/:id',
    access: 'admin',
    summary: "Change a person's role, or suspend or restore their account",
    params: idParams,
    body: personChange,
    handle: async ({ person, params, body }) => {
      const changed = await changePerson(deps.db, person!, params.id, body);
      // A security event besides the audit-log entry, so that it reaches whatever watches the log.
      deps.logger.warn(
        {
          event: 'person_changed',
          actorId: person!.id,
          personId: changed.id,
          role: changed.role,
          suspended: changed.suspendedAt !== null,
        },
        'role or suspension changed',
      );
      return { person: toPersonView(changed) };
    },
  }),
];
