import { z } from 'zod';

// Small schemas that many routes share.
export const idParams = z.object({ id: z.coerce.number().int().positive('Must be a positive whole number') });

export const pagination = z.object({
  page: z.coerce.number().int().min(1).max(1_000_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});
