import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { type Person, personResponseSchema, type Role } from '@/lib/person';
import { queryKeys } from '@/lib/query-keys';

export interface UpdatePersonInput {
  id: number;
  changes: { role?: Role; suspended?: boolean };
}

export async function updatePerson({ id, changes }: UpdatePersonInput): Promise<Person> {
  const { person } = await api.patch(apiPaths.person(id), personResponseSchema, changes);
  return person;
}

export function useUpdatePerson() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updatePerson,
    onSettled: () => queryClient.invalidateQueries({ queryKey: queryKeys.people.all() }),
  });
}
