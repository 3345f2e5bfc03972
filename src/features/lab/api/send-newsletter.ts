import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { type Newsletter, newsletterSchema } from '../lib/newsletters';

const sendResponseSchema = z.object({ newsletter: newsletterSchema, audienceSize: z.number().int() });

export interface SendNewsletterInput {
  id: number;
  /** An ISO instant to send at; absent to send now. */
  at?: string;
}

export interface SendNewsletterResult {
  newsletter: Newsletter;
  /** How many people the audience held when the request was made. */
  audienceSize: number;
}

export function sendNewsletter({ id, at }: SendNewsletterInput): Promise<SendNewsletterResult> {
  return api.post(apiPaths.newsletterSend(id), sendResponseSchema, at ? { at } : {});
}

/**
 * `onSent` is given here rather than to `mutate`: the answer turns the draft's page into a sending one,
 * which unmounts the send buttons, and callbacks given to `mutate` do not run once their caller is gone.
 */
export function useSendNewsletter({ onSent }: { onSent?: (result: SendNewsletterResult) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: sendNewsletter,
    onSuccess: (result) => {
      queryClient.setQueryData(queryKeys.newsletters.detail(result.newsletter.id), result.newsletter);
      onSent?.(result);
    },
    // A refusal (sent from another tab meanwhile) means what is shown is out of date too.
    onSettled: () => queryClient.invalidateQueries({ queryKey: queryKeys.newsletters.all() }),
  });
}
