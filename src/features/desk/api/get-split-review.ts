import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { type Review, reviewSchema } from '../lib/splits';

const reviewResponseSchema = z.object({ review: reviewSchema });

export async function getSplitReview(snippetId: number, signal?: AbortSignal): Promise<Review> {
  const { review } = await api.get(apiPaths.deskSplit(snippetId), reviewResponseSchema, { signal });
  return review;
}

export const splitReviewQueryOptions = (snippetId: number) =>
  queryOptions({
    queryKey: queryKeys.splits.review(snippetId),
    queryFn: ({ signal }) => getSplitReview(snippetId, signal),
  });

export function useSplitReview(snippetId: number) {
  return useQuery(splitReviewQueryOptions(snippetId));
}
