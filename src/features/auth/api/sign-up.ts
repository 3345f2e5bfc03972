import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { type Person, personResponseSchema } from '@/lib/person';
import { queryKeys } from '@/lib/query-keys';

export interface SignUpInput {
  email: string;
  displayName: string;
  password: string;
  newsletterOptIn: boolean;
}

export const minPasswordLength = 10;

export async function signUp(input: SignUpInput): Promise<Person> {
  const { person } = await api.post(apiPaths.signUp(), personResponseSchema, input, { rotatesSession: true });
  return person;
}

export function useSignUp() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signUp,
    onSuccess: (person) => {
      queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== queryKeys.me()[0] });
      queryClient.setQueryData(queryKeys.me(), person);
    },
  });
}
