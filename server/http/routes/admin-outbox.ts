import { z } from 'zod';
import { findMailMessage, listMailMessages } from '../../db/mail-messages';
import { notFound } from '../../errors';
import type { AppDeps } from '../app-deps';
import { defineRoute } from '../define-route';
import { idParams } from '../schemas';

const pageQuery = z.object({
  limit: z.coerce.number().int().min(1).max(200).default(50),
  offset: z.coerce.number().int().min(0).default(0),
});

export const adminOutboxRoutes = (deps: AppDeps) => [
  defineRoute({
    method: 'get',
    path: '/admin/outbox',
    access: 'admin',
    summary: 'The mail the embedded mail catcher received, newest first',
    query: pageQuery,
    handle: ({ query }) => listMailMessages(deps.db, query),
  }),
  defineRoute({
    method: 'get',
    path: '/admin/outbox/:id',
    access: 'admin',
    summary: 'One received message: its raw headers, plain text and HTML',
    params: idParams,
    handle: async ({ params }) => {
      const message = await findMailMessage(deps.db, params.id);
      if (!message) throw notFound('Message');
      return { message };
    },
  }),
];
