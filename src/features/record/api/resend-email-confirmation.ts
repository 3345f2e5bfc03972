import { useMutation } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';

const acceptedSchema = z.object({ message: z.string() });

/** Mails the signed-in person a fresh address-confirmation link; the answer says what was done. */
export async function resendEmailConfirmation(): Promise<string> {
  const { message } = await api.post(apiPaths.confirmEmailResend(), acceptedSchema);
  return message;
}

export function useResendEmailConfirmation() {
  return useMutation({ mutationFn: resendEmailConfirmation });
}
