import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys, type SplitListParams } from '@/lib/query-keys';
import { campaignsOf, type SplitPage, splitPageSchema } from '../lib/splits';

export function getSplits(params: SplitListParams, signal?: AbortSignal): Promise<SplitPage> {
  return api.get(apiPaths.deskSplits(), splitPageSchema, {
    query: {
      campaign: params.campaign ?? undefined,
      order: params.order,
      limit: params.limit,
      offset: params.offset,
    },
    signal,
  });
}

export const splitsQueryOptions = (params: SplitListParams) =>
  queryOptions({
    queryKey: queryKeys.splits.list(params),
    queryFn: ({ signal }) => getSplits(params, signal),
    placeholderData: keepPreviousData,
  });

export function useSplits(params: SplitListParams) {
  return useQuery(splitsQueryOptions(params));
}

/** The most the server gives in one answer: the review walks the queue within this window. */
export const queueWindow = 100;

/**
 * The campaigns that have split snippets, for the campaign filters: moderators may not list campaigns
 * (that is the Lab's), so they are read off the first window of the whole queue.
 */
export function useSplitCampaigns() {
  return useQuery({
    ...splitsQueryOptions({ campaign: null, order: 'oldest', limit: queueWindow, offset: 0 }),
    select: (page) => campaignsOf(page.splits),
  });
}
