/**
 * Every query key in the app comes from here, shaped `[resource, params]`, so invalidation can match on
 * the resource alone.
 */

export interface PeopleListParams {
  q: string;
  role: string;
  page: number;
  pageSize: number;
}

export const queryKeys = {
  me: () => ['me', {}] as const,
  people: {
    all: () => ['people'] as const,
    list: (params: PeopleListParams) => ['people', params] as const,
  },
} as const;
