// The period search: a scientist starts it, a worker job runs BLS over the target's light curves, and
// the latest result answers with the period found.
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { seedDemoSurvey } from '../../seeds/demo-survey';
import { createCampaign } from '../../seeds/factories/campaigns';
import { createTestApp, signedIn, type TestApp } from './support/test-app';

let test: TestApp;
let planetTarget: { id: number; periodDays: number };
let quietTargetId: number;

beforeAll(async () => {
  test = await createTestApp({ queues: true });
  const campaignId = await createCampaign(test.db, { status: 'live' });
  const { survey } = await seedDemoSurvey(test.db, {
    campaignId,
    targetCount: 12,
    seed: 'period-search-test',
  });
  // The invented survey records each star's truth: take the planet with the most transits on data.
  const planets = survey.targets
    .flatMap((star) => star.truth.planets.map((planet) => ({ star, planet })))
    .filter(({ planet }) => planet.transitTimesDays.length >= 3)
    .sort((a, b) => b.planet.expectedSnr - a.planet.expectedSnr);
  const chosen = planets[0]!;
  const target = await test
    .db('targets')
    .where({ campaign_id: campaignId, designation: chosen.star.designation })
    .first();
  planetTarget = { id: Number(target.id), periodDays: chosen.planet.periodDays };
  const quiet = survey.targets.find((star) => star.truth.kind === 'quiet')!;
  quietTargetId = Number(
    (await test.db('targets').where({ campaign_id: campaignId, designation: quiet.designation }).first()).id,
  );
});

/** A hang guard while the job runs, not a speed limit. */
async function finished(browser: Awaited<ReturnType<typeof signedIn>>['browser'], targetId: number) {
  for (let i = 0; i < 1_200; i += 1) {
    const answer = await browser.get(`/api/targets/${targetId}/period-search`);
    if (answer.body.periodSearch?.status === 'done' || answer.body.periodSearch?.status === 'failed')
      return answer;
    // While it waits or runs, the answer carries the job's progress (or null before the job reports).
    const { progress } = answer.body.periodSearch;
    if (progress !== null) {
      expect(progress.percent).toBeGreaterThanOrEqual(0);
      expect(progress.percent).toBeLessThanOrEqual(100);
      expect(typeof progress.stage).toBe('string');
    }
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
  throw new Error('the period search never finished');
}

describe('period search', () => {
  it('runs as a job and finds the planet’s period (the synthetic survey’s truth)', async () => {
    const { browser } = await signedIn(test, 'scientist');
    const started = await browser.post(`/api/targets/${planetTarget.id}/period-search`, {});
    expect(started.status).toBe(202);
    expect(started.body.periodSearch).toMatchObject({ status: 'queued', targetId: planetTarget.id });
    expect(started.body.periodSearch.job).toMatch(/^period-search:/);
    const done = await finished(browser, planetTarget.id);
    expect(done.status).toBe(200);
    const { result } = done.body.periodSearch;
    expect(done.body.periodSearch.status).toBe('done');
    expect(done.body.periodSearch.progress).toBeNull();
    // Within 1 % of the true period, or at its half or double (BLS may lock on an alias).
    const ratio = result.best.periodDays / planetTarget.periodDays;
    expect([0.5, 1, 2].some((alias) => Math.abs(ratio / alias - 1) < 0.01)).toBe(true);
    expect(result.best.snr).toBeGreaterThan(7.1);
    expect(result.diagnostics.atBest.transitsWithData).toBeGreaterThanOrEqual(2);
    expect(result.periodogram.periodsDays.length).toBe(result.periodogram.power.length);
    expect(result.periodogram.periodsDays.length).toBeLessThanOrEqual(2_000);
    const job = await browser.get(`/api/jobs/${encodeURIComponent(started.body.periodSearch.job)}`);
    expect(job.status).toBe(200);

    // Vetting from that search: derived parameters with errors and the diagnostics, each pass or warn.
    const vetting = await browser.get(`/api/targets/${planetTarget.id}/vetting`);
    expect(vetting.status).toBe(200);
    const { derived, diagnostics, source } = vetting.body.vetting;
    expect(source).toBe('period-search');
    expect(derived.radius.radiusEarth).toBeGreaterThan(0);
    expect(derived.radius.radiusEarthErr).toBeGreaterThan(0);
    expect(derived.orbit.transitProbability).toBeGreaterThan(0);
    expect(derived.orbit.statement).toMatch(/do not transit from our view/);
    expect(diagnostics.map((d: { code: string }) => d.code)).toEqual(
      expect.arrayContaining(['snr', 'radius', 'odd_even', 'secondary', 'shape', 'duration']),
    );
    for (const diagnostic of diagnostics) expect(['pass', 'warn']).toContain(diagnostic.verdict);
    const verdictOf = (code: string) => diagnostics.find((d: { code: string }) => d.code === code).verdict;
    expect(verdictOf('snr')).toBe('pass');
    // The survey's planet is a planet: its transit is flat-bottomed, fitted on the stored light curve.
    expect(verdictOf('shape')).toBe('pass');
  });

  it('answers null before any search, 404 for an unknown target, 400 for bad settings, 403 for volunteers', async () => {
    const { browser } = await signedIn(test, 'scientist');
    const none = await browser.get(`/api/targets/${quietTargetId}/period-search`);
    expect(none.status).toBe(200);
    expect(none.body).toEqual({ periodSearch: null });
    expect((await browser.post('/api/targets/999999/period-search', {})).status).toBe(404);
    expect((await browser.get('/api/targets/999999/period-search')).status).toBe(404);
    const bad = await browser.post(`/api/targets/${quietTargetId}/period-search`, { minPeriodDays: -1 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('minPeriodDays');
    const inverted = await browser.post(`/api/targets/${quietTargetId}/period-search`, {
      minPeriodDays: 5,
      maxPeriodDays: 2,
    });
    expect(inverted.status).toBe(400);
    expect(inverted.body.error.fields).toHaveProperty('maxPeriodDays');
    // Refused settings start nothing.
    expect((await browser.get(`/api/targets/${quietTargetId}/period-search`)).body.periodSearch).toBeNull();
    // Nothing to vet yet: no search and no measured dip.
    const vetting = await browser.get(`/api/targets/${quietTargetId}/vetting`);
    expect(vetting.status).toBe(409);
    expect(vetting.body.error.code).toBe('nothing_to_vet');
    expect((await browser.get('/api/targets/999999/vetting')).status).toBe(404);
    const volunteer = (await signedIn(test, 'volunteer')).browser;
    expect((await volunteer.post(`/api/targets/${quietTargetId}/period-search`, {})).status).toBe(403);
    expect((await request(test.app).get(`/api/targets/${quietTargetId}/period-search`)).status).toBe(401);
  });
});
