import { randomUUID } from 'node:crypto';
import type { Request } from 'express';
import { z } from 'zod';
import { AppError } from '../../errors';
import { defaultLiveCampaign, type Judge, nextCards } from '../../services/deck/next-cards';
import { recordVerdict, undoVerdict } from '../../services/deck/verdicts';
import { myRecord } from '../../services/record/my-record';
import type { AppDeps } from '../app-deps';
import { defineRoute } from '../define-route';
import { rowId, rowIdText } from '../schemas';

declare module 'express-session' {
  interface SessionData {
    /** A visitor's key for the verdicts they give before signing up. */
    guestKey?: string;
  }
}

/** The judge behind a request: the signed-in person, else the visitor's guest key (made on first use). */
function judgeOf(req: Request): Judge {
  if (req.user) {
    if (req.user.suspendedAt)
      throw new AppError('account_suspended', 'This account is suspended', 'forbidden');
    return { personId: req.user.id, lastActiveAt: req.user.lastActiveAt };
  }
  req.session.guestKey ??= randomUUID();
  return { guestKey: req.session.guestKey };
}

const nextQuery = z.object({
  campaign: rowIdText.optional(),
  count: z.coerce.number().int().min(1).max(10).default(3),
  exclude: z
    .string()
    .regex(/^\d+(,\d+)*$/, 'A comma-separated list of snippet ids')
    .max(400)
    .optional()
    .transform((list) => (list ? list.split(',').map(Number) : []))
    .pipe(z.array(rowId)),
});

const verdictBody = z
  .object({
    clientId: z.string().regex(/^[A-Za-z0-9_-]{8,64}$/, '8–64 letters, digits, - or _ (a UUID will do)'),
    snippetId: rowId,
    answer: z.enum(['dip', 'flat', 'unsure'], 'One of dip, flat or unsure'),
    markTime: z.number().finite().nullable().optional(),
    elapsedMs: z.number().int().min(0).max(3_600_000).optional(),
  })
  .strict();

export const deckRoutes = (deps: AppDeps) => [
  defineRoute({
    method: 'get',
    path: '/record',
    access: 'signed-in',
    summary: 'My record: your verdicts, accuracy on controls, and the dips and candidates you helped find',
    handle: async ({ person }) => ({ record: await myRecord(deps.db, person!.id) }),
  }),
  defineRoute({
    method: 'get',
    path: '/deck/next',
    access: 'public',
    summary:
      'The next cards to judge (visitors too, up to 20 verdicts): only what a card needs, never its kind or truth',
    query: nextQuery,
    handle: async ({ req, query }) => {
      if (req.user?.suspendedAt) return { cards: [], reason: 'suspended' };
      const campaignId = query.campaign ?? (await defaultLiveCampaign(deps.db));
      if (!campaignId) return { cards: [], reason: 'no_live_campaign' };
      const cards = await nextCards(deps.db, {
        campaignId,
        count: query.count,
        judge: judgeOf(req),
        exclude: query.exclude,
      });
      return { cards, ...(cards.length === 0 ? { reason: 'nothing_left' } : {}) };
    },
  }),
  defineRoute({
    method: 'post',
    path: '/verdicts',
    access: 'public',
    summary: 'Record a verdict (dip, flat or unsure, with an optional mark); idempotent by clientId',
    body: verdictBody,
    handle: async ({ req, res, body }) => {
      const judge = judgeOf(req);
      const result = await recordVerdict(deps.db, judge, body);
      // A guest's verdict counts only once claimed; the sweep rescores those snippets then.
      if (result.created && judge.personId) deps.rescoreRequests.request(result.campaignId);
      res.status(result.created ? 201 : 200).json({ verdict: result.verdict, reveal: result.reveal });
    },
  }),
  defineRoute({
    method: 'delete',
    path: '/verdicts/:clientId',
    access: 'public',
    summary: 'Take back a verdict within 15 seconds while its snippet is open',
    params: z.object({ clientId: z.string().regex(/^[A-Za-z0-9_-]{8,64}$/) }),
    handle: async ({ req, params }) => {
      const judge = judgeOf(req);
      const { campaignId } = await undoVerdict(deps.db, judge, params.clientId);
      if (judge.personId) deps.rescoreRequests.request(campaignId);
    },
  }),
];
