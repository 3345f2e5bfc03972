import { env } from '@/config/env';

/** A same-origin path we are willing to send someone back to after signing in. */
export function safeRedirect(target: string | null | undefined, fallback: string): string {
  if (target?.startsWith('/') && !target.startsWith('//')) return target;
  return fallback;
}

function withRedirect(path: string, redirectTo?: string): string {
  return redirectTo ? `${path}?redirectTo=${encodeURIComponent(redirectTo)}` : path;
}

/** The split queue as the address carries it: a campaign (or every one), an order and a page. */
export interface DeskQueueHref {
  campaign?: number | null;
  order?: 'oldest' | 'needed';
  page?: number;
}

function deskQueueSearch({ campaign, order, page }: DeskQueueHref): string {
  const search = new URLSearchParams();
  if (campaign) search.set('campaign', String(campaign));
  if (order && order !== 'oldest') search.set('order', order);
  if (page && page > 1) search.set('page', String(page));
  const text = search.toString();
  return text ? `?${text}` : '';
}

export type ExportFormat = 'csv' | 'json' | 'votable';

export const paths = {
  home: { path: '/', getHref: () => '/' },
  signIn: { path: '/sign-in', getHref: (redirectTo?: string) => withRedirect('/sign-in', redirectTo) },
  signUp: { path: '/sign-up', getHref: (redirectTo?: string) => withRedirect('/sign-up', redirectTo) },
  /** Asks for a link to choose a new password; the link in the mail opens `passwordResetConfirm`. */
  passwordReset: { path: '/password-reset', getHref: () => '/password-reset' },
  passwordResetConfirm: {
    path: '/password-reset/confirm',
    getHref: (token: string) => `/password-reset/confirm?token=${encodeURIComponent(token)}`,
  },
  confirmEmail: {
    path: '/confirm-email',
    getHref: (token: string) => `/confirm-email?token=${encodeURIComponent(token)}`,
  },
  deck: { path: '/deck', getHref: () => '/deck' },
  record: { path: '/record', getHref: () => '/record' },
  /** The Desk's home is its split queue; `campaign` and `order` filter and order it. */
  desk: {
    path: '/desk',
    getHref: (queue: DeskQueueHref = {}) => `/desk${deskQueueSearch(queue)}`,
  },
  /** One split snippet's review; the queue it was opened from comes along, so J and K follow it. */
  deskSplit: {
    path: '/desk/splits/:snippetId',
    getHref: (snippetId: number, queue: DeskQueueHref = {}) =>
      `/desk/splits/${snippetId}${deskQueueSearch(queue)}`,
  },
  deskVolunteers: { path: '/desk/volunteers', getHref: () => '/desk/volunteers' },
  deskAudit: { path: '/desk/audit', getHref: () => '/desk/audit' },
  lab: { path: '/lab', getHref: () => '/lab' },
  labNewCampaign: { path: '/lab/campaigns/new', getHref: () => '/lab/campaigns/new' },
  labCampaign: {
    path: '/lab/campaigns/:campaignId',
    getHref: (campaignId: number) => `/lab/campaigns/${campaignId}`,
  },
  labSnippets: {
    path: '/lab/campaigns/:campaignId/snippets',
    /** `target` opens the browser already filtered to one target's snippets. */
    getHref: (campaignId: number, filter: { target?: string } = {}) =>
      `/lab/campaigns/${campaignId}/snippets${filter.target ? `?target=${encodeURIComponent(filter.target)}` : ''}`,
  },
  labTarget: { path: '/lab/targets/:targetId', getHref: (targetId: number) => `/lab/targets/${targetId}` },
  /** A campaign's settled dips grouped by target, strongest first: where candidates are chosen. */
  labCandidateReview: {
    path: '/lab/campaigns/:campaignId/review',
    getHref: (campaignId: number) => `/lab/campaigns/${campaignId}/review`,
  },
  labFollowUp: {
    path: '/lab/campaigns/:campaignId/follow-up',
    getHref: (campaignId: number) => `/lab/campaigns/${campaignId}/follow-up`,
  },
  labCandidate: {
    path: '/lab/candidates/:candidateId',
    getHref: (candidateId: number) => `/lab/candidates/${candidateId}`,
  },
  labObservatories: { path: '/lab/observatories', getHref: () => '/lab/observatories' },
  labTokens: { path: '/lab/tokens', getHref: () => '/lab/tokens' },
  labApiReference: { path: '/lab/api', getHref: () => '/lab/api' },
  labNewsletters: { path: '/lab/newsletters', getHref: () => '/lab/newsletters' },
  labNewNewsletter: { path: '/lab/newsletters/new', getHref: () => '/lab/newsletters/new' },
  labNewsletter: {
    path: '/lab/newsletters/:newsletterId',
    getHref: (newsletterId: number) => `/lab/newsletters/${newsletterId}`,
  },
  admin: { path: '/admin', getHref: () => '/admin' },
  adminPeople: { path: '/admin/people', getHref: () => '/admin/people' },
  adminQueues: { path: '/admin/queues', getHref: () => '/admin/queues' },
  /** The mail the local mail catcher received, newest first; `page` counts from 1. */
  adminOutbox: {
    path: '/admin/outbox',
    getHref: (page = 1) => (page > 1 ? `/admin/outbox?page=${page}` : '/admin/outbox'),
  },
  adminOutboxMessage: {
    path: '/admin/outbox/:messageId',
    getHref: (messageId: number) => `/admin/outbox/${messageId}`,
  },
} as const;

export const apiPaths = {
  csrf: () => `${env.VITE_API_BASE}/auth/csrf`,
  me: () => `${env.VITE_API_BASE}/auth/me`,
  signIn: () => `${env.VITE_API_BASE}/auth/sign-in`,
  signUp: () => `${env.VITE_API_BASE}/auth/sign-up`,
  signOut: () => `${env.VITE_API_BASE}/auth/sign-out`,
  passwordReset: () => `${env.VITE_API_BASE}/auth/password-reset`,
  passwordResetConfirm: () => `${env.VITE_API_BASE}/auth/password-reset/confirm`,
  confirmEmail: () => `${env.VITE_API_BASE}/auth/confirm-email`,
  confirmEmailResend: () => `${env.VITE_API_BASE}/auth/confirm-email/resend`,
  people: () => `${env.VITE_API_BASE}/admin/people`,
  person: (id: number) => `${env.VITE_API_BASE}/admin/people/${id}`,
  queues: () => `${env.VITE_API_BASE}/admin/queues`,
  jobs: () => `${env.VITE_API_BASE}/admin/jobs`,
  // Job ids carry their queue ("mail:12"), so the id is encoded to stay one path segment whatever it holds.
  retryJob: (id: string) => `${env.VITE_API_BASE}/admin/jobs/${encodeURIComponent(id)}/retry`,
  outbox: () => `${env.VITE_API_BASE}/admin/outbox`,
  outboxMessage: (id: number) => `${env.VITE_API_BASE}/admin/outbox/${id}`,
  campaigns: () => `${env.VITE_API_BASE}/campaigns`,
  campaign: (id: number) => `${env.VITE_API_BASE}/campaigns/${id}`,
  campaignTargets: (id: number) => `${env.VITE_API_BASE}/campaigns/${id}/targets`,
  campaignLightCurves: (id: number) => `${env.VITE_API_BASE}/campaigns/${id}/light-curves`,
  campaignUploads: (id: number) => `${env.VITE_API_BASE}/campaigns/${id}/uploads`,
  campaignSnippets: (id: number) => `${env.VITE_API_BASE}/campaigns/${id}/snippets`,
  campaignCompleteness: (id: number) => `${env.VITE_API_BASE}/campaigns/${id}/completeness`,
  upload: (id: number) => `${env.VITE_API_BASE}/uploads/${id}`,
  snippet: (id: number) => `${env.VITE_API_BASE}/snippets/${id}`,
  target: (id: number) => `${env.VITE_API_BASE}/targets/${id}`,
  targetPeriodSearch: (id: number) => `${env.VITE_API_BASE}/targets/${id}/period-search`,
  targetVetting: (id: number) => `${env.VITE_API_BASE}/targets/${id}/vetting`,
  campaignDipTargets: (id: number) => `${env.VITE_API_BASE}/campaigns/${id}/dip-targets`,
  campaignCandidates: (id: number) => `${env.VITE_API_BASE}/campaigns/${id}/candidates`,
  candidate: (id: number) => `${env.VITE_API_BASE}/candidates/${id}`,
  candidateWindows: (id: number, count: number) =>
    `${env.VITE_API_BASE}/candidates/${id}/windows?count=${count}`,
  observatories: () => `${env.VITE_API_BASE}/observatories`,
  observatory: (id: number) => `${env.VITE_API_BASE}/observatories/${id}`,
  /** Downloads: the browser follows these links itself, with the session cookie. */
  campaignFollowUpExport: (id: number, format: ExportFormat) =>
    `${env.VITE_API_BASE}/campaigns/${id}/follow-up?format=${format}`,
  campaignConsensusExport: (id: number, format: ExportFormat) =>
    `${env.VITE_API_BASE}/campaigns/${id}/consensus?format=${format}`,
  tokens: () => `${env.VITE_API_BASE}/tokens`,
  token: (id: number) => `${env.VITE_API_BASE}/tokens/${id}`,
  openApi: () => `${env.VITE_API_BASE}/openapi.json`,
  deckNext: () => `${env.VITE_API_BASE}/deck/next`,
  verdicts: () => `${env.VITE_API_BASE}/verdicts`,
  // Client ids are [A-Za-z0-9_-], but encoding keeps the path one segment whatever a stored entry holds.
  verdict: (clientId: string) => `${env.VITE_API_BASE}/verdicts/${encodeURIComponent(clientId)}`,
  record: () => `${env.VITE_API_BASE}/record`,
  deskSplits: () => `${env.VITE_API_BASE}/desk/splits`,
  deskSplit: (snippetId: number) => `${env.VITE_API_BASE}/desk/splits/${snippetId}`,
  snippetRuling: (snippetId: number) => `${env.VITE_API_BASE}/snippets/${snippetId}/ruling`,
  deskVolunteers: () => `${env.VITE_API_BASE}/desk/volunteers`,
  deskVolunteerSuspend: (id: number) => `${env.VITE_API_BASE}/desk/volunteers/${id}/suspend`,
  deskVolunteerRestore: (id: number) => `${env.VITE_API_BASE}/desk/volunteers/${id}/restore`,
  deskVolunteerClearFlag: (id: number, code: string) =>
    `${env.VITE_API_BASE}/desk/volunteers/${id}/flags/${encodeURIComponent(code)}/clear`,
  deskVolunteerWarning: (id: number) => `${env.VITE_API_BASE}/desk/volunteers/${id}/warning`,
  audit: () => `${env.VITE_API_BASE}/audit`,
  newsletters: () => `${env.VITE_API_BASE}/newsletters`,
  newsletter: (id: number) => `${env.VITE_API_BASE}/newsletters/${id}`,
  newsletterPreview: () => `${env.VITE_API_BASE}/newsletters/preview`,
  newsletterTest: (id: number) => `${env.VITE_API_BASE}/newsletters/${id}/test`,
  newsletterSend: (id: number) => `${env.VITE_API_BASE}/newsletters/${id}/send`,
} as const;
