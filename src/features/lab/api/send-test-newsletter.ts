import { useMutation } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';

const testResponseSchema = z.object({ message: z.string() });

/** Queues a copy to the person asking; answers what the server says about where it goes. */
export function sendTestNewsletter(id: number): Promise<string> {
  return api.post(apiPaths.newsletterTest(id), testResponseSchema, {}).then(({ message }) => message);
}

export function useSendTestNewsletter(id: number) {
  return useMutation({ mutationFn: () => sendTestNewsletter(id) });
}
