import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { type Audience, type Newsletter, newsletterResponseSchema } from '../lib/newsletters';

export interface CreateNewsletterInput {
  headline: string;
  bodyMarkdown: string;
  audience: Audience;
  allowRemoteImages: boolean;
}

export async function createNewsletter(input: CreateNewsletterInput): Promise<Newsletter> {
  const { newsletter } = await api.post(apiPaths.newsletters(), newsletterResponseSchema, input);
  return newsletter;
}

export function useCreateNewsletter() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createNewsletter,
    onSuccess: (newsletter) => {
      // The newsletter's page opens next: give it the answer rather than asking again.
      queryClient.setQueryData(queryKeys.newsletters.detail(newsletter.id), newsletter);
      return queryClient.invalidateQueries({ queryKey: queryKeys.newsletters.list() });
    },
  });
}
