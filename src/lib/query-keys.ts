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

export interface OutboxListParams {
  limit: number;
  offset: number;
}

export interface TargetListParams {
  campaignId: number;
  q: string;
  page: number;
  pageSize: number;
}

export interface SnippetListParams {
  campaignId: number;
  /** '' for every state, kind or target. */
  state: string;
  kind: string;
  target: string;
  sort: 'id' | 'timeStart' | 'verdictCount' | 'consensusScore';
  order: 'asc' | 'desc';
  page: number;
  pageSize: number;
}

export interface DeckNextParams {
  /** A campaign id, or null for the newest live one. */
  campaign: number | null;
  count: number;
  /** Snippet ids the client holds or has judged but not yet sent, oldest first. */
  exclude: readonly number[];
}

export interface SplitListParams {
  /** A campaign id, or null for every campaign. */
  campaign: number | null;
  order: 'oldest' | 'needed';
  limit: number;
  offset: number;
}

export interface DeskVolunteerListParams {
  campaign: number | null;
  search: string;
  flagged: boolean;
  sort: 'name' | 'verdicts' | 'controlAccuracy' | 'agreement' | 'medianMs' | 'topShare' | 'lastActive';
  order: 'asc' | 'desc';
  limit: number;
  offset: number;
}

export interface AuditListParams {
  /** '' for any action or entity type; actorId null for anyone. */
  action: string;
  entityType: string;
  actorId: number | null;
  /** ISO instants, or '' for no bound. */
  from: string;
  to: string;
  limit: number;
  offset: number;
}

export interface NewsletterPreviewParams {
  headline: string;
  bodyMarkdown: string;
  allowRemoteImages: boolean;
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
  // The list and each message share the resource, so one refresh reaches both.
  outbox: {
    all: () => ['outbox'] as const,
    list: (params: OutboxListParams) => ['outbox', params] as const,
    detail: (id: number) => ['outbox', { id }] as const,
  },
  // A campaign's counts change with every upload, so uploads invalidate 'campaigns' as a whole.
  campaigns: {
    all: () => ['campaigns'] as const,
    list: () => ['campaigns', {}] as const,
    detail: (id: number) => ['campaigns', { id }] as const,
    // Under the campaign, so that what refreshes a campaign (new controls from an upload) refreshes it too.
    completeness: (id: number) => ['campaigns', { id, part: 'completeness' }] as const,
  },
  targets: {
    all: () => ['targets'] as const,
    list: (params: TargetListParams) => ['targets', params] as const,
    detail: (id: number) => ['targets', { id }] as const,
    // Under the target, so that what refreshes a target (a promotion) refreshes these too.
    periodSearch: (id: number) => ['targets', { id, part: 'period-search' }] as const,
    vetting: (id: number) => ['targets', { id, part: 'vetting' }] as const,
  },
  // A campaign's dip targets and candidates change together (a promotion marks its target), so they
  // share the resource: invalidating 'candidates' refreshes the review list, the follow-up list and
  // each candidate's windows.
  candidates: {
    all: () => ['candidates'] as const,
    dipTargets: (campaignId: number) => ['candidates', { campaignId, part: 'dip-targets' }] as const,
    ofCampaign: (campaignId: number) => ['candidates', { campaignId }] as const,
    detail: (candidateId: number) => ['candidates', { candidateId }] as const,
    windows: (candidateId: number, count: number) => ['candidates', { candidateId, count }] as const,
  },
  observatories: {
    all: () => ['observatories'] as const,
    list: () => ['observatories', {}] as const,
  },
  uploads: {
    all: () => ['uploads'] as const,
    ofCampaign: (campaignId: number) => ['uploads', { campaignId }] as const,
    detail: (id: number) => ['uploads', { id }] as const,
  },
  snippets: {
    all: () => ['snippets'] as const,
    list: (params: SnippetListParams) => ['snippets', params] as const,
    detail: (id: number) => ['snippets', { id }] as const,
  },
  tokens: {
    all: () => ['tokens'] as const,
    list: () => ['tokens', {}] as const,
  },
  openApi: () => ['openapi', {}] as const,
  deck: {
    all: () => ['deck'] as const,
    next: (params: DeckNextParams) => ['deck', params] as const,
  },
  record: {
    all: () => ['record'] as const,
    mine: () => ['record', {}] as const,
  },
  // The queue and each review share the resource, so a ruling refreshes both.
  splits: {
    all: () => ['splits'] as const,
    list: (params: SplitListParams) => ['splits', params] as const,
    review: (snippetId: number) => ['splits', { snippetId }] as const,
  },
  deskVolunteers: {
    all: () => ['desk-volunteers'] as const,
    list: (params: DeskVolunteerListParams) => ['desk-volunteers', params] as const,
  },
  audit: {
    all: () => ['audit'] as const,
    list: (params: AuditListParams) => ['audit', params] as const,
  },
  // Sending changes the list and the newsletter together, so they share the resource.
  newsletters: {
    all: () => ['newsletters'] as const,
    list: () => ['newsletters', {}] as const,
    detail: (id: number) => ['newsletters', { id }] as const,
  },
  // A resource of its own: refreshing the newsletters need not render every preview again.
  newsletterPreview: (content: NewsletterPreviewParams) => ['newsletter-preview', content] as const,
} as const;
