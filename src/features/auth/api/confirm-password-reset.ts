import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { forgetSignedInPerson } from './sign-out';

export interface PasswordResetConfirmInput {
  token: string;
  password: string;
}

const confirmedSchema = z.object({ ok: z.literal(true) });

export async function confirmPasswordReset(input: PasswordResetConfirmInput): Promise<void> {
  // The server ends every session of the person, this browser's included, so its CSRF token goes too.
  await api.post(apiPaths.passwordResetConfirm(), confirmedSchema, input, { rotatesSession: true });
}

export function useConfirmPasswordReset() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: confirmPasswordReset,
    onSuccess: () => forgetSignedInPerson(queryClient),
  });
}
