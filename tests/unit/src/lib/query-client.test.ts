import { describe, expect, it } from 'vitest';
import { ApiError } from '@/lib/api-client';
import { createQueryClient } from '@/lib/query-client';
import { queryKeys } from '@/lib/query-keys';

describe('query client', () => {
  it('when any query answers 401, treats the person as signed out', async () => {
    const client = createQueryClient();
    client.setQueryData(queryKeys.me(), { id: 1 });
    await client
      .fetchQuery({
        queryKey: queryKeys.people.list({ q: '', role: '', page: 1, pageSize: 20 }),
        queryFn: () => Promise.reject(new ApiError(401, 'not_signed_in', 'Sign in first')),
      })
      .catch(() => undefined);
    expect(client.getQueryData(queryKeys.me())).toBeNull();
  });

  it('does not retry a client error', () => {
    const client = createQueryClient();
    const retry = client.getDefaultOptions().queries?.retry;
    expect(typeof retry).toBe('function');
    if (typeof retry !== 'function') return;
    expect(retry(0, new ApiError(403, 'forbidden', 'No'))).toBe(false);
    expect(retry(0, new ApiError(503, 'unavailable', 'Later'))).toBe(true);
  });
});
