import { z } from 'zod';

export const tokenSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  prefix: z.string(),
  createdAt: z.string(),
  lastUsedAt: z.string().nullable(),
  revokedAt: z.string().nullable(),
});

export type Token = z.infer<typeof tokenSchema>;

export const createdTokenSchema = z.object({ token: tokenSchema, secret: z.string().min(1) });

export type CreatedToken = z.infer<typeof createdTokenSchema>;
