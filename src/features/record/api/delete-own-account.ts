import { useMutation } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { apiRequest } from '@/lib/api-client';

const deletedSchema = z.object({ deleted: z.literal(true) });

/**
 * Deletes the signed-in person's account: their address, name and sign-in go, their verdicts stay without a
 * name. The server ends the session, so whoever calls this forgets the person afterwards.
 */
export async function deleteOwnAccount(password: string): Promise<void> {
  const body = await apiRequest(apiPaths.me(), {
    method: 'DELETE',
    body: { password },
    rotatesSession: true,
  });
  deletedSchema.parse(body);
}

export function useDeleteOwnAccount() {
  return useMutation({ mutationFn: deleteOwnAccount });
}
