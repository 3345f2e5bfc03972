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

const NUL = '\u0000';
const MAX_REPORTED = 20;

/**
 * The fields of a parsed input whose text holds U+0000, one message per field path. PostgreSQL's
 * text cannot hold that character and refuses it even as a query parameter, so no input may carry it.
 * Walks without recursion (a JSON body can nest tens of thousands deep), in time linear in the input.
 */
export function nulCharacterFields(value: unknown): FieldErrors {
  const fields: FieldErrors = {};
  type Node = { value: unknown; key: string; parent: Node | null };
  const pathOf = (node: Node): string => {
    const keys: string[] = [];
    for (let at: Node | null = node; at?.parent; at = at.parent) keys.push(at.key);
    return keys.length > 0 ? keys.reverse().join('.') : '_';
  };
  const stack: Node[] = [{ value, key: '', parent: null }];
  let reported = 0;
  while (stack.length > 0 && reported < MAX_REPORTED) {
    const node = stack.pop()!;
    if (typeof node.value === 'string') {
      if (node.value.includes(NUL)) {
        fields[pathOf(node)] = 'Must not contain the NUL character (U+0000)';
        reported += 1;
      }
    } else if (node.value !== null && typeof node.value === 'object') {
      for (const [key, inner] of Object.entries(node.value)) stack.push({ value: inner, key, parent: node });
    }
  }
  return fields;
}
