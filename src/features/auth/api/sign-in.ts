import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { type Person, personResponseSchema } from '@/lib/person';
import { queryKeys } from '@/lib/query-keys';

export interface SignInInput {
  email: string;
  password: string;
}

export async function signIn(input: SignInInput): Promise<Person> {
  const { person } = await api.post(apiPaths.signIn(), personResponseSchema, input, { rotatesSession: true });
  return person;
}

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: (person) => {
      // Whatever was cached belonged to the previous session.
      queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== queryKeys.me()[0] });
      queryClient.setQueryData(queryKeys.me(), person);
    },
  });
}
