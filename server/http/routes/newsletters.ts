import { z } from 'zod';
import { resolveSessionSecret } from '../../auth/session-secret';
import {
  createNewsletter,
  newsletters,
  oneNewsletter,
  previewNewsletter,
  sendNewsletter,
  sendTestCopy,
} from '../../services/newsletters/manage-newsletters';
import type { AppDeps } from '../app-deps';
import { defineRoute } from '../define-route';
import { idParams, rowId } from '../schemas';

const audience = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('opted-in') }).strict(),
  z.object({ kind: z.literal('active'), days: z.number().int().min(1).max(3_650) }).strict(),
  z.object({ kind: z.literal('campaign'), campaignId: rowId }).strict(),
]);

const content = {
  headline: z.string('Write a headline').trim().min(1, 'Write a headline').max(200, 'At most 200 characters'),
  bodyMarkdown: z.string('Write the newsletter').trim().min(1, 'Write the newsletter').max(100_000),
  allowRemoteImages: z.boolean().default(false),
};

const newsletterBody = z.object({ ...content, audience }).strict();
const previewBody = z.object(content).strict();
const sendBody = z
  .object({
    at: z.iso
      .datetime({ offset: true, message: 'An ISO date and time, like 2026-12-24T09:00:00Z' })
      .optional(),
  })
  .strict()
  .optional();

// Scientists and admins write and send newsletters (the Lab); every other role gets 403.
export const newsletterRoutes = (deps: AppDeps) => {
  const links = {
    publicUrl: deps.config.publicUrl,
    secret: resolveSessionSecret(deps.config.sessionSecret, deps.config.dataDir),
  };
  return [
    defineRoute({
      method: 'post',
      path: '/newsletters',
      access: 'scientist',
      summary: 'Write a newsletter (a draft): headline, Markdown body, audience',
      body: newsletterBody,
      status: 201,
      handle: ({ person, body }) => createNewsletter(deps.db, person!, body),
    }),
    defineRoute({
      method: 'get',
      path: '/newsletters',
      access: 'scientist',
      summary: 'Every newsletter, newest first, with its progress',
      handle: () => newsletters(deps.db),
    }),
    defineRoute({
      method: 'post',
      path: '/newsletters/preview',
      access: 'scientist',
      summary:
        'Render a newsletter as you would receive it (sanitised HTML and plain text), for the live preview',
      body: previewBody,
      handle: ({ person, body }) => previewNewsletter(deps.db, person!, body, links),
    }),
    defineRoute({
      method: 'get',
      path: '/newsletters/:id',
      access: 'scientist',
      summary: 'One newsletter with its progress: queued, sent, failed, skipped as unsubscribed, unknown',
      params: idParams,
      handle: ({ params }) => oneNewsletter(deps.db, params.id),
    }),
    defineRoute({
      method: 'post',
      path: '/newsletters/:id/test',
      access: 'scientist',
      summary: 'Send a test copy to yourself',
      params: idParams,
      status: 202,
      handle: ({ params, person }) => sendTestCopy(deps.db, deps.queues, person!, params.id),
    }),
    defineRoute({
      method: 'post',
      path: '/newsletters/:id/send',
      access: 'scientist',
      summary:
        'Send now, or at a time (`at`); each reader is mailed once, through the rate-limited mail queue',
      params: idParams,
      body: sendBody,
      status: 202,
      handle: ({ params, person, body }) =>
        sendNewsletter(deps.db, deps.queues, person!, params.id, body?.at),
    }),
  ];
};
