import { z } from 'zod';

// Small schemas that many routes share.

/** Ids are 32-bit integer columns (Knex `increments`, PostgreSQL `integer`): no row has a larger one. */
export const MAX_ROW_ID = 2_147_483_647;
const tooLargeForAnId = `At most ${MAX_ROW_ID}: no id is larger`;

/** A row's id in a JSON body. */
export const rowId = z.number().int().positive().max(MAX_ROW_ID, tooLargeForAnId);
/** A row's id in a path or a query string. */
export const rowIdText = z.coerce
  .number()
  .int()
  .positive('Must be a positive whole number')
  .max(MAX_ROW_ID, tooLargeForAnId);

export const idParams = z.object({ id: rowIdText });

export const pagination = z.object({
  page: z.coerce.number().int().min(1).max(1_000_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});
