import { queryOptions } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { type DeckNextParams, queryKeys } from '@/lib/query-keys';
import { cardSchema, deckReasons } from '../lib/cards';

const nextCardsSchema = z.object({
  cards: z.array(cardSchema),
  reason: z.enum(deckReasons).optional(),
});

export type NextCards = z.infer<typeof nextCardsSchema>;

export function getNextCards(params: DeckNextParams, signal?: AbortSignal): Promise<NextCards> {
  return api.get(apiPaths.deckNext(), nextCardsSchema, {
    signal,
    query: {
      campaign: params.campaign ?? undefined,
      count: params.count,
      exclude: params.exclude.length > 0 ? params.exclude.join(',') : undefined,
    },
  });
}

/**
 * Every request names the cards the device holds, so its key is new each time: the answer is used once
 * by the Deck's queue and then forgotten, never served stale from the cache.
 */
export const nextCardsQueryOptions = (params: DeckNextParams) =>
  queryOptions({
    queryKey: queryKeys.deck.next(params),
    queryFn: ({ signal }) => getNextCards(params, signal),
    staleTime: 0,
    gcTime: 0,
    retry: false,
  });
