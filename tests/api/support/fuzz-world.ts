import { createSnippetFixtures } from '../../../seeds/factories/snippets';
import { type Browser, personWithRole, signedIn, type TestApp } from './test-app';

/**
 * What the fuzzed requests act on: real rows, so that a request that passes validation reaches the
 * service and the database rather than stopping at "not found".
 */
export interface FuzzWorld {
  /** Signed in as an admin, who may call every route that is not public. */
  admin: Browser;
  adminId: number;
  /** The campaign the Lab routes act on (live, with one target, a light curve and snippets). */
  campaignId: number;
  /** A campaign of its own for PATCH /campaigns/:id, which may close it. */
  patchedCampaignId: number;
  targetId: number;
  targetDesignation: string;
  snippetId: number;
  candidateId: number;
  observatoryId: number;
  newsletterId: number;
  tokenId: number;
  /** A volunteer the staff routes act on: never the caller, so that suspending them changes nobody's session. */
  volunteerId: number;
  /** An account the sign-in example names (with a wrong password). */
  signInEmail: string;
}

async function created<T>(
  answer: Promise<{ status: number; body: T; text: string }>,
  what: string,
): Promise<T> {
  const response = await answer;
  if (response.status >= 300)
    throw new Error(`fuzz world: ${what} answered ${response.status} ${response.text}`);
  return response.body;
}

export async function buildFuzzWorld(test: TestApp): Promise<FuzzWorld> {
  const { browser: admin, person } = await signedIn(test, 'admin');
  const volunteer = await personWithRole(test.db, 'volunteer', { email: 'fuzz-volunteer@example.com' });
  const signIn = await personWithRole(test.db, 'volunteer', { email: 'fuzz-sign-in@example.com' });
  const { campaign } = await created<{ campaign: { id: number } }>(
    admin.post('/api/campaigns', { name: 'Fuzz campaign' }),
    'the campaign',
  );
  const { campaign: patched } = await created<{ campaign: { id: number } }>(
    admin.post('/api/campaigns', { name: 'Fuzz campaign to change' }),
    'the campaign to change',
  );
  await created(admin.patch(`/api/campaigns/${campaign.id}`, { status: 'live' }), 'going live');
  const { targetIds, snippetIds } = await createSnippetFixtures(test.db, campaign.id, {
    targets: 1,
    real: 3,
  });
  const targetId = targetIds[0]!;
  const { candidate } = await created<{ candidate: { id: number } }>(
    admin.post(`/api/campaigns/${campaign.id}/candidates`, { targetId }),
    'the candidate',
  );
  const { observatory } = await created<{ observatory: { id: number } }>(
    admin.post('/api/observatories', { name: 'Fuzz Ridge', latitudeDeg: -24.6, longitudeDeg: -70.4 }),
    'the observatory',
  );
  const { newsletter } = await created<{ newsletter: { id: number } }>(
    admin.post('/api/newsletters', {
      headline: 'Fuzz news',
      bodyMarkdown: 'Hello from the fuzz test.',
      audience: { kind: 'opted-in' },
    }),
    'the newsletter',
  );
  const { token } = await created<{ token: { id: number } }>(
    admin.post('/api/tokens', { name: 'Fuzz token' }),
    'the token',
  );
  return {
    admin,
    adminId: person.id,
    campaignId: campaign.id,
    patchedCampaignId: patched.id,
    targetId,
    targetDesignation: 'FIX-000000',
    snippetId: snippetIds.real[0]!,
    candidateId: candidate.id,
    observatoryId: observatory.id,
    newsletterId: newsletter.id,
    tokenId: token.id,
    volunteerId: volunteer.id,
    signInEmail: signIn.email!,
  };
}
