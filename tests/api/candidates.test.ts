// Promotion to the follow-up list: the ephemeris from the period search, the credits of the volunteers
// who found the dips, states and dispositions, and the caution that a candidate is not a planet.
import { beforeAll, describe, expect, it } from 'vitest';
import { seedDemoSurvey } from '../../seeds/demo-survey';
import { createCampaign } from '../../seeds/factories/campaigns';
import { createPerson } from '../../seeds/factories/people';
import { nowIso } from '../../server/db/rows';
import { periodSigmaDays, transitTimeSigmaDays } from '../../server/services/candidates/manage-candidates';
import { createTestApp, signedIn, type TestApp } from './support/test-app';

let test: TestApp;
let campaignId: number;
let targetId: number;
let otherTargetId: number;
let dipIds: number[];
let otherDipId: number;

async function dip(target: number, timeCenter: number, finders: number[]): Promise<number> {
  const now = nowIso();
  const snippet = await test.db('snippets').where({ target_id: target, kind: 'real' }).first('id');
  const [row] = await test
    .db('dips')
    .insert({
      snippet_id: snippet.id,
      target_id: target,
      campaign_id: campaignId,
      cluster_index: timeCenter > 0 ? Math.round(timeCenter * 10) % 1000 : 0,
      time_center: timeCenter,
      depth_ppm: 5_000,
      duration_hours: 3,
      snr: 20,
      created_at: now,
      updated_at: now,
    })
    .returning('id');
  const id = Number(typeof row === 'object' ? row.id : row);
  await test.db('dip_finders').insert(finders.map((personId) => ({ dip_id: id, person_id: personId })));
  return id;
}

beforeAll(async () => {
  test = await createTestApp({ queues: true });
  campaignId = await createCampaign(test.db, { status: 'live' });
  const { survey } = await seedDemoSurvey(test.db, { campaignId, targetCount: 12, seed: 'candidates-test' });
  const planet = survey.targets
    .filter((star) => star.truth.planets.some((p) => p.transitTimesDays.length >= 3))
    .sort((a, b) => b.truth.planets[0]!.expectedSnr - a.truth.planets[0]!.expectedSnr)[0]!;
  targetId = Number(
    (await test.db('targets').where({ campaign_id: campaignId, designation: planet.designation }).first()).id,
  );
  otherTargetId = Number(
    (await test.db('targets').where({ campaign_id: campaignId }).whereNot({ id: targetId }).first()).id,
  );
  const named = await createPerson(test.db, {
    displayName: 'Named Finder',
    creditByName: true,
    reuseHash: true,
  });
  const unnamed = await createPerson(test.db, { displayName: 'Private Finder', reuseHash: true });
  const [first, second] = planet.truth.planets[0]!.transitTimesDays;
  dipIds = [await dip(targetId, first!, [named.id, unnamed.id]), await dip(targetId, second!, [named.id])];
  otherDipId = await dip(otherTargetId, 5, [unnamed.id]);
});

describe('the candidate review', () => {
  it('lists targets with settled dips, the strongest first, with their dips', async () => {
    const { browser } = await signedIn(test, 'scientist');
    const answer = await browser.get(`/api/campaigns/${campaignId}/dip-targets`);
    expect(answer.status).toBe(200);
    const { targets } = answer.body;
    // Both targets' dips have SNR 20; the one with two dips comes first.
    expect(targets.map((t: { targetId: number }) => t.targetId)).toEqual([targetId, otherTargetId]);
    expect(targets[0]).toMatchObject({ dipCount: 2, bestSnr: 20 });
    expect(targets[0].dips.map((d: { id: number }) => d.id)).toEqual(dipIds);
    expect((await browser.get('/api/campaigns/999999/dip-targets')).status).toBe(404);
  });
});

describe('the follow-up list', () => {
  it('promotes a target with its dips and the period search’s ephemeris, crediting the named finders', async () => {
    const { browser } = await signedIn(test, 'scientist');
    expect((await browser.post(`/api/targets/${targetId}/period-search`, {})).status).toBe(202);
    for (let i = 0; i < 1_200; i += 1) {
      const state = (await browser.get(`/api/targets/${targetId}/period-search`)).body.periodSearch?.status;
      if (state === 'done') break;
      await new Promise((resolve) => setTimeout(resolve, 100));
    }
    const promoted = await browser.post(`/api/campaigns/${campaignId}/candidates`, {
      targetId,
      dipIds,
      notes: 'Deep and regular',
    });
    expect(promoted.status).toBe(201);
    const { candidate } = promoted.body;
    expect(candidate).toMatchObject({ targetId, state: 'promoted', disposition: 'planet candidate', dipIds });
    expect(candidate.periodDays).toBeGreaterThan(0);
    expect(candidate.t0Bjd).toBeGreaterThan(2_457_000); // BTJD days plus the survey's BJD reference
    expect(candidate.t0SigmaDays).toBeGreaterThan(0);
    expect(candidate.periodSigmaDays).toBeGreaterThan(0);
    expect(candidate.priority).toBeGreaterThan(0);
    expect(candidate.credits).toEqual({ named: ['Named Finder'], others: 1 });
    expect(candidate.caution).toMatch(/not a confirmed planet/);
    const [audit] = await test
      .db('audit_log')
      .where({ action: 'candidate.promoted', entity_id: String(candidate.id) });
    expect(audit).toBeTruthy();

    const list = await browser.get(`/api/campaigns/${campaignId}/candidates`);
    expect(list.body.caution).toMatch(/not a confirmed planet/);
    expect(list.body.candidates.map((c: { id: number }) => c.id)).toEqual([candidate.id]);

    const again = await browser.post(`/api/campaigns/${campaignId}/candidates`, { targetId });
    expect(again.status).toBe(409);
  });

  it('moves a candidate through its states and dispositions, on the record', async () => {
    const { browser } = await signedIn(test, 'scientist');
    const [candidate] = (await browser.get(`/api/campaigns/${campaignId}/candidates`)).body.candidates;
    const scheduled = await browser.patch(`/api/candidates/${candidate.id}`, { state: 'scheduled' });
    expect(scheduled.status).toBe(200);
    expect(scheduled.body.candidate.state).toBe('scheduled');
    const resolved = await browser.patch(`/api/candidates/${candidate.id}`, {
      state: 'resolved',
      disposition: 'eclipsing binary',
    });
    expect(resolved.body.candidate).toMatchObject({ state: 'resolved', disposition: 'eclipsing binary' });
    const entries = await test
      .db('audit_log')
      .where({ action: 'candidate.changed', entity_id: String(candidate.id) });
    expect(entries).toHaveLength(2);
    expect((await browser.patch(`/api/candidates/${candidate.id}`, { state: 'confirmed' })).status).toBe(400);
    expect((await browser.patch(`/api/candidates/${candidate.id}`, {})).status).toBe(400);
    expect((await browser.patch('/api/candidates/999999', { state: 'observed' })).status).toBe(404);

    // One candidate on its own: what the list holds, with its credits and the caution.
    const one = await browser.get(`/api/candidates/${candidate.id}`);
    expect(one.status).toBe(200);
    expect(one.body.candidate).toMatchObject({
      id: candidate.id,
      state: 'resolved',
      disposition: 'eclipsing binary',
      dipIds: candidate.dipIds,
      credits: candidate.credits,
    });
    expect(one.body.candidate.caution).toMatch(/not a confirmed planet/);
    expect((await browser.get('/api/candidates/999999')).status).toBe(404);
    expect((await browser.get('/api/candidates/abc')).status).toBe(400);
    const volunteer = (await signedIn(test, 'volunteer')).browser;
    expect((await volunteer.get(`/api/candidates/${candidate.id}`)).status).toBe(403);
  });

  it('refuses dips of another target, targets of another campaign, and volunteers', async () => {
    const { browser } = await signedIn(test, 'scientist');
    const wrongDip = await browser.post(`/api/campaigns/${campaignId}/candidates`, {
      targetId: otherTargetId,
      dipIds: [dipIds[0]],
    });
    expect(wrongDip.status).toBe(400);
    expect(wrongDip.body.error.fields).toHaveProperty('dipIds');
    const elsewhere = await createCampaign(test.db, { status: 'draft' });
    const wrongCampaign = await browser.post(`/api/campaigns/${elsewhere}/candidates`, { targetId });
    expect(wrongCampaign.status).toBe(400);
    expect(wrongCampaign.body.error.fields).toHaveProperty('targetId');
    expect((await browser.post('/api/campaigns/999999/candidates', { targetId })).status).toBe(404);
    const volunteer = (await signedIn(test, 'volunteer')).browser;
    expect((await volunteer.get(`/api/campaigns/${campaignId}/candidates`)).status).toBe(403);
    expect(otherDipId).toBeGreaterThan(0);
  });
});

describe('ephemeris uncertainties', () => {
  it('follow Carter et al. 2008 (τ = T/10) and least squares over the epochs (hand-computed)', () => {
    // T = 0.125 d, Q = 20: σ = 0.125/20 · √0.05 = 0.0013975 d.
    expect(transitTimeSigmaDays(0.125, 20)).toBeCloseTo(0.0013975, 7);
    // Four transits: √(12 / (4 · 15)) = 0.4472 of the timing error.
    expect(periodSigmaDays(0.001, 4)).toBeCloseTo(0.0004472, 7);
    expect(periodSigmaDays(0.001, 1)).toBeNull();
  });
});
