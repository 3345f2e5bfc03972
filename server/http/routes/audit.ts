import { z } from 'zod';
import { listAudit } from '../../db/audit-log';
import type { AppDeps } from '../app-deps';
import { defineRoute } from '../define-route';
import { rowIdText } from '../schemas';

const isoDate = z.iso.datetime({ offset: true, message: 'An ISO 8601 date and time' });

const auditQuery = z
  .object({
    action: z.string().trim().max(64).optional(),
    entityType: z.string().trim().max(32).optional(),
    entityId: z.string().trim().max(64).optional(),
    actorId: rowIdText.optional(),
    from: isoDate.optional(),
    to: isoDate.optional(),
    limit: z.coerce.number().int().min(1).max(200).default(50),
    offset: z.coerce.number().int().min(0).max(1_000_000).default(0),
  })
  .strict();

// Read only: the audit log is appended to by the services that act, and no route changes it.
export const auditRoutes = (deps: AppDeps) => [
  defineRoute({
    method: 'get',
    path: '/audit',
    access: 'moderator',
    summary: 'The audit log of staff actions, newest first: who, when, what, before and after',
    query: auditQuery,
    handle: async ({ query }) => {
      const { entries, total } = await listAudit(deps.db, query);
      return {
        total,
        entries: entries.map(({ actorId, actorName, ...entry }) => ({
          ...entry,
          actor: actorId === null ? null : { id: actorId, displayName: actorName ?? '' },
        })),
      };
    },
  }),
];
