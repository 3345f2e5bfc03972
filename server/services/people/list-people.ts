import type { Role } from '../../auth/roles';
import type { Db } from '../../db/knex';
import { listPeople as queryPeople } from '../../db/people';
import { type PersonView, toPersonView } from './person-view';

export interface ListPeopleInput {
  q?: string | undefined;
  role?: Role | undefined;
  page: number;
  pageSize: number;
}

export async function listPeople(
  db: Db,
  input: ListPeopleInput,
): Promise<{ people: PersonView[]; total: number; page: number; pageSize: number }> {
  const { people, total } = await queryPeople(db, {
    search: input.q,
    role: input.role,
    limit: input.pageSize,
    offset: (input.page - 1) * input.pageSize,
  });
  return { people: people.map(toPersonView), total, page: input.page, pageSize: input.pageSize };
}
