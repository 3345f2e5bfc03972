import { useMutation } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';

const acceptedSchema = z.object({ message: z.string() });

/**
 * Asks the server to mail a reset link. The answer is the same whether or not the address has an
 * account, so that the form cannot be used to find out who uses Dipdeck.
 */
export async function requestPasswordReset(email: string): Promise<string> {
  const { message } = await api.post(apiPaths.passwordReset(), acceptedSchema, { email });
  return message;
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}
