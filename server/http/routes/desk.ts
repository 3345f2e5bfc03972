import { z } from 'zod';
import { ruleSnippet } from '../../services/desk/rule-snippet';
import { deskSplits, splitReview } from '../../services/desk/splits';
import {
  AUDIT_SORTS,
  clearFlag,
  recordWarning,
  restoreVolunteer,
  suspendVolunteer,
  volunteerAudit,
} from '../../services/desk/volunteers';
import type { AppDeps } from '../app-deps';
import { defineRoute } from '../define-route';
import { idParams, rowIdText } from '../schemas';

const limitOffset = {
  limit: z.coerce.number().int().min(1).max(100).default(50),
  offset: z.coerce.number().int().min(0).max(1_000_000).default(0),
};

const splitsQuery = z
  .object({
    campaign: rowIdText.optional(),
    order: z.enum(['oldest', 'needed'], 'oldest or needed').default('oldest'),
    ...limitOffset,
  })
  .strict();

const rulingBody = z
  .object({
    ruling: z.enum(['dip', 'flat', 'systematic'], 'One of dip, flat or systematic'),
    note: z.string().max(2_000).nullable().optional(),
  })
  .strict();

const volunteersQuery = z
  .object({
    campaign: rowIdText.optional(),
    search: z.string().trim().max(100).optional(),
    flagged: z
      .enum(['true', 'false'], 'true or false')
      .transform((value) => value === 'true')
      .optional(),
    sort: z.enum(AUDIT_SORTS).default('name'),
    order: z.enum(['asc', 'desc']).default('asc'),
    ...limitOffset,
  })
  .strict();

const flagParams = z.object({
  id: rowIdText,
  code: z.enum(['too_fast', 'chance_accuracy', 'one_answer', 'burst'], 'An automatic flag'),
});

const noteRequired = (max: number) =>
  z.object({ note: z.string().trim().min(1, 'Say why').max(max) }).strict();

export const deskRoutes = (deps: AppDeps) => {
  const rescore = (campaignIds: number[]) => {
    for (const campaignId of campaignIds) deps.rescoreRequests.request(campaignId);
  };
  return [
    defineRoute({
      method: 'get',
      path: '/desk/splits',
      access: 'moderator',
      summary: 'Split snippets waiting for a ruling, oldest first (or those on a candidate’s target first)',
      query: splitsQuery,
      handle: ({ query }) => deskSplits(deps.db, query),
    }),
    defineRoute({
      method: 'get',
      path: '/desk/splits/:id',
      access: 'moderator',
      summary:
        'One snippet for review: full-resolution data, verdicts with names and weights, score over time, neighbours',
      params: idParams,
      handle: ({ params }) => splitReview(deps.db, params.id),
    }),
    defineRoute({
      method: 'post',
      path: '/snippets/:id/ruling',
      access: 'moderator',
      summary:
        'Rule on a snippet: dip, flat or systematic (an instrumental feature, no transit), with a note',
      params: idParams,
      body: rulingBody,
      status: 201,
      handle: async ({ params, body, person }) => {
        const { campaignId, ...result } = await ruleSnippet(deps.db, person!, params.id, body);
        rescore([campaignId]);
        return result;
      },
    }),
    defineRoute({
      method: 'get',
      path: '/desk/volunteers',
      access: 'moderator',
      summary: 'The volunteer audit: verdicts, accuracy on controls, agreement, pace, and automatic flags',
      query: volunteersQuery,
      handle: ({ query }) => volunteerAudit(deps.db, query),
    }),
    defineRoute({
      method: 'post',
      path: '/desk/volunteers/:id/suspend',
      access: 'moderator',
      summary: 'Suspend a volunteer: their verdicts stop counting and what they judged is rescored',
      params: idParams,
      body: z.object({ reason: z.string().trim().min(1, 'Say why').max(500) }).strict(),
      handle: async ({ params, body, person }) => {
        const { campaignIds, ...result } = await suspendVolunteer(deps.db, person!, params.id, body.reason);
        rescore(campaignIds);
        return result;
      },
    }),
    defineRoute({
      method: 'post',
      path: '/desk/volunteers/:id/restore',
      access: 'moderator',
      summary: 'Lift a suspension: the verdicts count again and what they judged is rescored',
      params: idParams,
      body: z.object({ note: z.string().trim().max(500).optional() }).strict(),
      handle: async ({ params, body, person }) => {
        const { campaignIds, ...result } = await restoreVolunteer(deps.db, person!, params.id, body.note);
        rescore(campaignIds);
        return result;
      },
    }),
    defineRoute({
      method: 'post',
      path: '/desk/volunteers/:id/flags/:code/clear',
      access: 'moderator',
      summary: 'Clear an automatic flag on a volunteer, saying why',
      params: flagParams,
      body: noteRequired(500),
      handle: ({ params, body, person }) => clearFlag(deps.db, person!, params.id, params.code, body.note),
    }),
    defineRoute({
      method: 'post',
      path: '/desk/volunteers/:id/warning',
      access: 'moderator',
      summary: 'Warn a volunteer (recorded on the audit log; e-mailed once Dipdeck sends e-mail)',
      params: idParams,
      body: noteRequired(2_000),
      status: 201,
      handle: ({ params, body, person }) =>
        recordWarning(deps.db, deps.queues, person!, params.id, body.note),
    }),
  ];
};
