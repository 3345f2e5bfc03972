import type { FuzzWorld } from './fuzz-world';

// Valid requests per route, keyed "METHOD /path" as in the route table (server/http/route-table.ts).
// The fuzz test mutates them, and checks each against its route's schema first, so that they cannot
// rot: a route with a body or params schema and no entry here fails that check by name.

type Example<T> = (world: FuzzWorld) => T;

const WRONG_PASSWORD = 'not the right passphrase';

/** One valid body per route that takes one (for the light-curve upload: its multipart fields). */
export const exampleBodies: Record<string, Example<Record<string, unknown>>> = {
  'POST /auth/sign-up': () => ({
    email: 'fuzz-sign-up@example.com',
    displayName: 'Fuzz Newcomer',
    password: 'a long enough passphrase',
    newsletterOptIn: false,
  }),
  'POST /auth/sign-in': (world) => ({ email: world.signInEmail, password: WRONG_PASSWORD }),
  'PATCH /auth/me': () => ({ displayName: 'Fuzz Admin', newsletterOptIn: true, creditByName: false }),
  // A wrong password: the handler checks it and refuses, so the caller's account survives the fuzzing.
  'DELETE /auth/me': () => ({ password: WRONG_PASSWORD }),
  'POST /auth/password-reset': () => ({ email: 'nobody-has-this@example.com' }),
  'POST /auth/password-reset/confirm': () => ({ token: 'r'.repeat(43), password: 'a new long passphrase' }),
  'POST /auth/confirm-email': () => ({ token: 'c'.repeat(43) }),
  'PATCH /admin/people/:id': () => ({ role: 'moderator', reason: 'Helps on the Desk' }),
  'POST /tokens': () => ({ name: 'Fuzz script' }),
  'POST /campaigns': () => ({ name: 'Fuzz search', snippetLengthDays: 2, plantedShare: 0.1 }),
  'PATCH /campaigns/:id': () => ({ description: 'Changed by the fuzz test', verdictsToSettle: 6 }),
  'POST /campaigns/:id/candidates': (world) => ({
    targetId: world.targetId,
    notes: 'Two clear dips',
    telescopePrecisionPpm: 800,
  }),
  'PATCH /candidates/:id': () => ({ state: 'scheduled', disposition: 'planet candidate', notes: null }),
  'POST /observatories': () => ({
    name: 'Fuzz Plateau',
    latitudeDeg: 28.76,
    longitudeDeg: -17.88,
    elevationM: 2396,
    minTargetAltitudeDeg: 30,
    sunAltitudeLimitDeg: -12,
  }),
  'PATCH /observatories/:id': () => ({ elevationM: 2400, minTargetAltitudeDeg: 25 }),
  'POST /campaigns/:id/light-curves': (world) => ({
    target: world.targetDesignation,
    quietReference: 'false',
  }),
  'POST /targets/:id/period-search': () => ({ minPeriodDays: 0.5, maxPeriodDays: 1.5, oversample: 1 }),
  'POST /verdicts': (world) => ({
    clientId: 'fuzz-verdict-0001',
    snippetId: world.snippetId,
    answer: 'dip',
    markTime: 1.25,
    elapsedMs: 2500,
  }),
  'POST /snippets/:id/ruling': () => ({ ruling: 'flat', note: 'Only noise' }),
  'POST /desk/volunteers/:id/suspend': () => ({ reason: 'Answers at random' }),
  'POST /desk/volunteers/:id/restore': () => ({ note: 'Talked it through' }),
  'POST /desk/volunteers/:id/flags/:code/clear': () => ({ note: 'A fast but careful volunteer' }),
  'POST /desk/volunteers/:id/warning': () => ({ note: 'Please look at each light curve' }),
  'POST /newsletters': (world) => ({
    headline: 'New dips found',
    bodyMarkdown: 'Thanks to **you**, three new dips.',
    allowRemoteImages: false,
    audience: { kind: 'campaign', campaignId: world.campaignId },
  }),
  'POST /newsletters/preview': () => ({ headline: 'Preview', bodyMarkdown: 'Hello *{{displayName}}*' }),
  'POST /newsletters/:id/send': () => ({ at: '2031-03-01T09:00:00Z' }),
};

/** Path parameters per route: real rows, so that a request that passes validation reaches the service. */
export const exampleParams: Record<string, Example<Record<string, string | number>>> = {
  'PATCH /admin/people/:id': (world) => ({ id: world.volunteerId }),
  'GET /admin/outbox/:id': () => ({ id: 1 }),
  'GET /jobs/:id': () => ({ id: 'ingest:upload-1' }),
  'POST /admin/jobs/:id/retry': () => ({ id: 'ingest:upload-1' }),
  'DELETE /tokens/:id': (world) => ({ id: world.tokenId }),
  'GET /campaigns/:id': (world) => ({ id: world.campaignId }),
  'GET /campaigns/:id/completeness': (world) => ({ id: world.campaignId }),
  'PATCH /campaigns/:id': (world) => ({ id: world.patchedCampaignId }),
  'POST /campaigns/:id/candidates': (world) => ({ id: world.campaignId }),
  'GET /campaigns/:id/dip-targets': (world) => ({ id: world.campaignId }),
  'GET /campaigns/:id/candidates': (world) => ({ id: world.campaignId }),
  'GET /candidates/:id': (world) => ({ id: world.candidateId }),
  'PATCH /candidates/:id': (world) => ({ id: world.candidateId }),
  'GET /candidates/:id/windows': (world) => ({ id: world.candidateId }),
  'PATCH /observatories/:id': (world) => ({ id: world.observatoryId }),
  'DELETE /observatories/:id': (world) => ({ id: world.observatoryId }),
  'GET /campaigns/:id/follow-up': (world) => ({ id: world.campaignId }),
  'GET /campaigns/:id/consensus': (world) => ({ id: world.campaignId }),
  'POST /campaigns/:id/targets': (world) => ({ id: world.campaignId }),
  'GET /campaigns/:id/targets': (world) => ({ id: world.campaignId }),
  'POST /campaigns/:id/light-curves': (world) => ({ id: world.campaignId }),
  'GET /campaigns/:id/uploads': (world) => ({ id: world.campaignId }),
  'GET /uploads/:id': () => ({ id: 1 }),
  'GET /campaigns/:id/snippets': (world) => ({ id: world.campaignId }),
  'GET /snippets/:id': (world) => ({ id: world.snippetId }),
  'POST /snippets/:id/quiet': (world) => ({ id: world.snippetId }),
  'GET /targets/:id': (world) => ({ id: world.targetId }),
  'POST /targets/:id/period-search': (world) => ({ id: world.targetId }),
  'GET /targets/:id/vetting': (world) => ({ id: world.targetId }),
  'GET /targets/:id/period-search': (world) => ({ id: world.targetId }),
  'DELETE /verdicts/:clientId': () => ({ clientId: 'fuzz-verdict-0001' }),
  'GET /desk/splits/:id': (world) => ({ id: world.snippetId }),
  'POST /snippets/:id/ruling': (world) => ({ id: world.snippetId }),
  'POST /desk/volunteers/:id/suspend': (world) => ({ id: world.volunteerId }),
  'POST /desk/volunteers/:id/restore': (world) => ({ id: world.volunteerId }),
  'POST /desk/volunteers/:id/flags/:code/clear': (world) => ({ id: world.volunteerId, code: 'too_fast' }),
  'POST /desk/volunteers/:id/warning': (world) => ({ id: world.volunteerId }),
  'GET /newsletters/:id': (world) => ({ id: world.newsletterId }),
  'POST /newsletters/:id/test': (world) => ({ id: world.newsletterId }),
  'POST /newsletters/:id/send': (world) => ({ id: world.newsletterId }),
};
