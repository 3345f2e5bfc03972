import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { type Person, personResponseSchema } from '@/lib/person';
import { queryKeys } from '@/lib/query-keys';

export async function confirmEmail(token: string): Promise<Person> {
  const { person } = await api.post(apiPaths.confirmEmail(), personResponseSchema, { token });
  return person;
}

export function useConfirmEmail() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: confirmEmail,
    // The link may be opened in a browser signed in as someone else, or as nobody: only the person it
    // confirmed gets the fresh view, and nobody is signed in by following it.
    onSuccess: (person) =>
      queryClient.setQueryData<Person | null>(queryKeys.me(), (current) =>
        current && current.id === person.id ? person : current,
      ),
  });
}
