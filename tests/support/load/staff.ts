import type { SignedInSession } from './sign-in';
import { type PlannedRequest, readJson } from './volunteer';

interface Page {
  route: string;
  path: (state: { splitId: number | null }) => string | null;
}

/** What the Lab's pages ask for while a scientist reads a campaign and downloads its exports. */
export const scientistPages = (campaignId: number): Page[] => [
  { route: 'campaign', path: () => `/api/campaigns/${campaignId}` },
  { route: 'completeness', path: () => `/api/campaigns/${campaignId}/completeness` },
  { route: 'dip_targets', path: () => `/api/campaigns/${campaignId}/dip-targets` },
  { route: 'candidates', path: () => `/api/campaigns/${campaignId}/candidates` },
  { route: 'export_consensus_csv', path: () => `/api/campaigns/${campaignId}/consensus?format=csv` },
  { route: 'export_consensus_votable', path: () => `/api/campaigns/${campaignId}/consensus?format=votable` },
  { route: 'export_follow_up_votable', path: () => `/api/campaigns/${campaignId}/follow-up?format=votable` },
];

/** What the Desk asks for while a moderator works down the split queue (the page size is the Desk's, 25). */
export const moderatorPages = (campaignId: number): Page[] => [
  { route: 'desk_splits', path: () => `/api/desk/splits?campaign=${campaignId}&limit=25&offset=0` },
  { route: 'desk_split', path: ({ splitId }) => (splitId === null ? null : `/api/desk/splits/${splitId}`) },
  { route: 'desk_volunteers', path: () => `/api/desk/volunteers?campaign=${campaignId}&limit=25&offset=0` },
];

/** A member of staff reading pages in turn, one request at a time; pages with nothing to show yet are skipped. */
export class StaffClient {
  private index = 0;
  private splitId: number | null = null;
  private inFlight: PlannedRequest | null = null;

  constructor(
    readonly session: SignedInSession,
    private readonly pages: Page[],
  ) {}

  next(): PlannedRequest {
    for (;;) {
      const page = this.pages[this.index % this.pages.length]!;
      this.index += 1;
      const path = page.path({ splitId: this.splitId });
      if (path === null) continue;
      this.inFlight = {
        route: page.route,
        method: 'GET',
        path,
        headers: { cookie: this.session.cookie, accept: '*/*' },
      };
      return this.inFlight;
    }
  }

  answer(status: number, body: string): void {
    const request = this.inFlight;
    this.inFlight = null;
    if (request?.route === 'desk_splits' && status === 200) {
      const splits = readJson<{ splits: { snippetId: number }[] }>(body)?.splits;
      this.splitId = splits?.[0]?.snippetId ?? null;
    }
  }
}
