import type { z } from 'zod';
import type { FieldErrors } from '../errors';

/** zod issues as one message per field path ("email", "settings.snippetLengthDays"); the first wins. */
export function fieldErrors(error: z.ZodError): FieldErrors {
  const fields: FieldErrors = {};
  for (const issue of error.issues) {
    const key = issue.path.length > 0 ? issue.path.join('.') : '_';
    fields[key] ??= issue.message;
  }
  return fields;
}
