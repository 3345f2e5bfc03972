import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createCampaign } from '../../seeds/factories/campaigns';
import { createSnippetFixtures } from '../../seeds/factories/snippets';
// Made by tests/reference/make_completeness_reference.py with astropy 5.2.1
// astropy.stats.binom_conf_interval (interval='wilson').
import reference from '../fixtures/reference/wilson.json';
import { type Browser, createTestApp, signedIn, type TestApp } from './support/test-app';

let test: TestApp;
let campaignId: number;
let scientist: Browser;

/** astropy.stats.binom_conf_interval(k, n, confidence_level=0.95, interval='wilson'), from the fixture. */
function astropyWilson95(successes: number, trials: number): { low: number; high: number } {
  const found = reference.intervals['95'].cases.find(
    (row) => row.successes === successes && row.trials === trials,
  );
  if (!found) throw new Error(`no reference interval for ${successes}/${trials}`);
  return found;
}

async function setControl(
  id: number,
  change: { state: string; outcome: 'dip' | 'flat' | null; truth?: Record<string, number> },
) {
  await test
    .db('snippets')
    .where({ id })
    .update({
      state: change.state,
      outcome: change.outcome,
      ...(change.truth
        ? {
            planted_truth: JSON.stringify({ t0Days: 1, impact: 0.3, ...change.truth }),
          }
        : {}),
    });
}

beforeAll(async () => {
  test = await createTestApp();
  scientist = (await signedIn(test, 'scientist')).browser;
  campaignId = await createCampaign(test.db, { name: 'Completeness field', status: 'live' });
  const { snippetIds } = await createSnippetFixtures(test.db, campaignId, {
    targets: 3,
    real: 3,
    planted: 12,
    quiet: 5,
  });
  const p = snippetIds.planted;
  const bright = { expectedSnr: 25, depthPpm: 3000, durationHours: 2 };
  const faint = { expectedSnr: 8, depthPpm: 400, durationHours: 5 };
  for (const id of p.slice(0, 5)) await setControl(id, { state: 'settled', outcome: 'dip', truth: bright });
  await setControl(p[5]!, { state: 'ruled', outcome: 'flat', truth: bright });
  await setControl(p[6]!, { state: 'settled', outcome: 'dip', truth: faint });
  await setControl(p[7]!, { state: 'settled', outcome: 'flat', truth: faint });
  await setControl(p[8]!, { state: 'ruled', outcome: 'flat', truth: faint });
  await setControl(p[9]!, { state: 'open', outcome: null, truth: faint });
  // Split, with an outcome left from before: waits on the Desk, so it is pending.
  await setControl(p[10]!, { state: 'split', outcome: 'dip' });
  // p[11] stays open with the factory's truth (SNR 12, 900 ppm, 3 h).
  const q = snippetIds.quiet;
  await setControl(q[0]!, { state: 'settled', outcome: 'dip' });
  await setControl(q[1]!, { state: 'settled', outcome: 'flat' });
  await setControl(q[2]!, { state: 'settled', outcome: 'flat' });
  await setControl(q[3]!, { state: 'ruled', outcome: 'flat' });
  // A real snippet's outcome is no control's: it must not count.
  await setControl(snippetIds.real[0]!, { state: 'settled', outcome: 'dip' });

  // Another campaign's controls must not leak into this one's table.
  const other = await createCampaign(test.db, { name: 'Elsewhere' });
  const elsewhere = await createSnippetFixtures(test.db, other, {
    targets: 1,
    real: 0,
    planted: 3,
    quiet: 2,
  });
  for (const id of [...elsewhere.snippetIds.planted, ...elsewhere.snippetIds.quiet]) {
    await setControl(id, { state: 'settled', outcome: 'dip' });
  }
});

describe('GET /api/campaigns/:id/completeness', () => {
  it('counts recovered, missed and pending planted dips per SNR, depth and duration bin, with Wilson intervals', async () => {
    const browser = scientist;
    const response = await browser.get(`/api/campaigns/${campaignId}/completeness`);
    expect(response.status).toBe(200);
    const { completeness } = response.body;

    const overall = astropyWilson95(6, 9);
    expect(completeness.planted).toMatchObject({ total: 12, recovered: 6, missed: 3, pending: 3 });
    expect(completeness.planted.rate).toBeCloseTo(6 / 9, 12);
    expect(completeness.planted.wilsonLow).toBeCloseTo(overall.low, 6);
    expect(completeness.planted.wilsonHigh).toBeCloseTo(overall.high, 6);

    // The campaign plants SNR 7–30 (the defaults), so those bins are listed even when empty.
    type Bin = { lower: number; upper: number | null; recovered: number; missed: number; pending: number };
    const counts = (bins: Bin[]) => bins.map((b) => [b.lower, b.upper, b.recovered, b.missed, b.pending]);
    expect(counts(completeness.bySnr)).toEqual([
      [5, 7.1, 0, 0, 0],
      [7.1, 10, 1, 2, 1],
      [10, 15, 0, 0, 2],
      [15, 20, 0, 0, 0],
      [20, 30, 5, 1, 0],
    ]);
    const bright = completeness.bySnr[4];
    expect(bright.rate).toBeCloseTo(5 / 6, 12);
    expect(bright.wilsonLow).toBeCloseTo(astropyWilson95(5, 6).low, 6);
    expect(bright.wilsonHigh).toBeCloseTo(astropyWilson95(5, 6).high, 6);
    expect(completeness.bySnr[0]).toMatchObject({ rate: null, wilsonLow: null, wilsonHigh: null });
    expect(completeness.bySnr[2]).toMatchObject({ pending: 2, rate: null });

    expect(counts(completeness.byDepth)).toEqual([
      [200, 500, 1, 2, 1],
      [500, 1000, 0, 0, 2],
      [1000, 2000, 0, 0, 0],
      [2000, 5000, 5, 1, 0],
    ]);
    expect(counts(completeness.byDuration)).toEqual([
      [2, 3, 5, 1, 0],
      [3, 4, 0, 0, 2],
      [4, 6, 1, 2, 1],
    ]);
  });

  it('gives the false-dip rate on quiet controls that have an outcome, with its Wilson interval', async () => {
    const browser = scientist;
    const { completeness } = (await browser.get(`/api/campaigns/${campaignId}/completeness`)).body;
    expect(completeness.quiet).toMatchObject({ total: 5, falseDips: 1, flat: 3, pending: 1, rate: 0.25 });
    expect(completeness.quiet.wilsonLow).toBeCloseTo(astropyWilson95(1, 4).low, 6);
    expect(completeness.quiet.wilsonHigh).toBeCloseTo(astropyWilson95(1, 4).high, 6);
    expect(completeness.interval).toEqual({ method: 'wilson', z: 1.959964 });
  });

  it('for a campaign without controls answers empty counts, null rates and the planted SNR range’s bins', async () => {
    const browser = scientist;
    const empty = await createCampaign(test.db, { name: 'Nothing yet' });
    const response = await browser.get(`/api/campaigns/${empty}/completeness`);
    expect(response.status).toBe(200);
    const { completeness } = response.body;
    expect(completeness.planted).toEqual({
      total: 0,
      recovered: 0,
      missed: 0,
      pending: 0,
      rate: null,
      wilsonLow: null,
      wilsonHigh: null,
    });
    expect(completeness.quiet).toMatchObject({ total: 0, rate: null });
    expect(completeness.bySnr.map((bin: { lower: number }) => bin.lower)).toEqual([5, 7.1, 10, 15, 20]);
    expect(completeness.byDepth).toEqual([]);
    expect(completeness.byDuration).toEqual([]);
  });

  it('answers 404 for an unknown campaign and 400 naming the id for one that is not a positive whole number', async () => {
    const browser = scientist;
    const missing = await browser.get('/api/campaigns/99999/completeness');
    expect(missing.status).toBe(404);
    expect(missing.body.error.code).toBe('not_found');
    for (const id of ['abc', '0', '-3', '1.5']) {
      const bad = await browser.get(`/api/campaigns/${id}/completeness`);
      expect(bad.status, id).toBe(400);
      expect(Object.keys(bad.body.error.fields ?? {}), id).toEqual(['id']);
    }
  });

  it('answers 403 to volunteers and moderators and 401 to visitors', async () => {
    for (const role of ['volunteer', 'moderator'] as const) {
      const { browser } = await signedIn(test, role);
      const response = await browser.get(`/api/campaigns/${campaignId}/completeness`);
      expect(response.status, role).toBe(403);
      expect(response.body.completeness).toBeUndefined();
    }
    expect((await request(test.app).get(`/api/campaigns/${campaignId}/completeness`)).status).toBe(401);
  });
});
