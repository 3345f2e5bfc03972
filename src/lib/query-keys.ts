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

export interface JobListParams {
  state: 'failed';
  /** A queue name, or '' for every queue. */
  queue: string;
  limit: number;
}

export const queryKeys = {
  me: () => ['me', {}] as const,
  people: {
    all: () => ['people'] as const,
    list: (params: PeopleListParams) => ['people', params] as const,
  },
  queues: {
    all: () => ['queues'] as const,
    overview: () => ['queues', {}] as const,
  },
  jobs: {
    all: () => ['jobs'] as const,
    list: (params: JobListParams) => ['jobs', params] as const,
  },
} as const;
