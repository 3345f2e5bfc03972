import { z } from 'zod';
import { createToken, listTokens, revokeToken } from '../../services/tokens/manage-tokens';
import type { AppDeps } from '../app-deps';
import { defineRoute } from '../define-route';
import { idParams } from '../schemas';

const tokenInput = z
  .object({ name: z.string().trim().min(1, 'Name the token').max(80, 'At most 80 characters') })
  .strict();

export const tokenRoutes = (deps: AppDeps) => [
  defineRoute({
    method: 'post',
    path: '/tokens',
    access: 'scientist',
    summary: 'Create a named API token; the secret is shown in this answer only',
    body: tokenInput,
    status: 201,
    handle: async ({ person, body }) => createToken(deps.db, person!, body.name),
  }),
  defineRoute({
    method: 'get',
    path: '/tokens',
    access: 'scientist',
    summary: 'Your API tokens (never their secrets)',
    handle: async ({ person }) => ({ tokens: await listTokens(deps.db, person!) }),
  }),
  defineRoute({
    method: 'delete',
    path: '/tokens/:id',
    access: 'scientist',
    summary: 'Revoke one of your API tokens',
    params: idParams,
    handle: async ({ person, params }) => {
      await revokeToken(deps.db, person!, params.id);
    },
  }),
];
