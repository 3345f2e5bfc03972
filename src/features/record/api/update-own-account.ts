import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { type Person, personResponseSchema } from '@/lib/person';
import { queryKeys } from '@/lib/query-keys';

export interface OwnAccountChange {
  displayName?: string;
  newsletterOptIn?: boolean;
  creditByName?: boolean;
}

export async function updateOwnAccount(change: OwnAccountChange): Promise<Person> {
  const { person } = await api.patch(apiPaths.me(), personResponseSchema, change);
  return person;
}

export function useUpdateOwnAccount() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateOwnAccount,
    onSuccess: (person) => queryClient.setQueryData(queryKeys.me(), person),
    onSettled: () => queryClient.invalidateQueries({ queryKey: queryKeys.me() }),
  });
}
