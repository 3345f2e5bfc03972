import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { type NewsletterContent, type NewsletterPreview, newsletterPreviewSchema } from '../lib/newsletters';

const previewResponseSchema = z.object({ preview: newsletterPreviewSchema });

export function previewNewsletter(
  content: NewsletterContent,
  signal?: AbortSignal,
): Promise<NewsletterPreview> {
  return api
    .post(apiPaths.newsletterPreview(), previewResponseSchema, content, { signal })
    .then(({ preview }) => preview);
}

// A POST, but it changes nothing: as a query, a newer draft's answer replaces an older one's and a
// late answer for text since changed is dropped.
export const newsletterPreviewQueryOptions = (content: NewsletterContent) =>
  queryOptions({
    queryKey: queryKeys.newsletterPreview(content),
    queryFn: ({ signal }) => previewNewsletter(content, signal),
    placeholderData: keepPreviousData,
    staleTime: 60_000,
  });

/** The preview of `content`; nothing is asked while the headline or the body is empty (the server would refuse). */
export function useNewsletterPreview(content: NewsletterContent) {
  return useQuery({
    ...newsletterPreviewQueryOptions(content),
    enabled: content.headline.trim() !== '' && content.bodyMarkdown.trim() !== '',
  });
}
