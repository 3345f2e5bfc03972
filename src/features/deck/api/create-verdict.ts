import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { answers, type Reveal, revealSchema } from '../lib/cards';

const verdictResponseSchema = z.object({
  verdict: z.object({
    clientId: z.string(),
    snippetId: z.number().int(),
    answer: z.enum(answers),
    markTime: z.number().nullable(),
    createdAt: z.string(),
  }),
  reveal: revealSchema,
});

export interface VerdictInput {
  clientId: string;
  snippetId: number;
  answer: (typeof answers)[number];
  markTime: number | null;
  elapsedMs: number | null;
}

/**
 * Sends one verdict. Called only by the Deck's outbox, which retries it with the same clientId (the
 * server answers a repeat with the verdict it already stored), so there is no mutation hook.
 */
export async function createVerdict(input: VerdictInput): Promise<Reveal> {
  const body = {
    clientId: input.clientId,
    snippetId: input.snippetId,
    answer: input.answer,
    ...(input.answer === 'dip' && input.markTime !== null ? { markTime: input.markTime } : {}),
    ...(input.elapsedMs !== null
      ? { elapsedMs: Math.min(3_600_000, Math.max(0, Math.round(input.elapsedMs))) }
      : {}),
  };
  const { reveal } = await api.post(apiPaths.verdicts(), verdictResponseSchema, body);
  return reveal;
}
