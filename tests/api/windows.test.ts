// Transit windows of a candidate for the observatories in the Lab, never with the target near the Sun.
import { beforeAll, describe, expect, it } from 'vitest';
import { createCampaign } from '../../seeds/factories/campaigns';
import { createPerson } from '../../seeds/factories/people';
import { nowIso } from '../../server/db/rows';
import { upsertTarget } from '../../server/db/targets';
import { candidateWindows } from '../../server/services/candidates/transit-windows';
import { createTestApp, signedIn, type TestApp } from './support/test-app';

let test: TestApp;
let candidateId: number;
let singleTransitId: number;

async function candidate(targetId: number, campaignId: number, periodDays: number | null): Promise<number> {
  const now = nowIso();
  const [row] = await test
    .db('candidates')
    .insert({
      campaign_id: campaignId,
      target_id: targetId,
      state: 'promoted',
      disposition: 'planet candidate',
      // The worked ephemeris: T0 = 2459000.12345 ± 0.0005, P = 3.7 ± 0.00002 d.
      period_days: periodDays,
      period_sigma_days: periodDays ? 0.00002 : null,
      t0_bjd: 2459000.12345,
      t0_sigma_days: 0.0005,
      duration_hours: 2.5,
      created_at: now,
      updated_at: now,
    })
    .returning('id');
  return Number(typeof row === 'object' ? row.id : row);
}

beforeAll(async () => {
  test = await createTestApp();
  const campaignId = await createCampaign(test.db, { status: 'live' });
  const fields = { magnitude: 11, stellarRadiusRsun: 1, stellarMassMsun: 1, teffK: 5800, assumedFields: [] };
  // The check position (RA 330.79488°, Dec +18.88432°): the Sun passes it in late February.
  const { target } = await upsertTarget(test.db, campaignId, {
    designation: 'WIN-000001',
    raDeg: 330.79488,
    decDeg: 18.88432,
    ...fields,
  });
  const { target: other } = await upsertTarget(test.db, campaignId, {
    designation: 'WIN-000002',
    raDeg: 10,
    decDeg: -5,
    ...fields,
  });
  candidateId = await candidate(target.id, campaignId, 3.7);
  singleTransitId = await candidate(other.id, campaignId, null);
  const scientist = await createPerson(test.db, { role: 'scientist', reuseHash: true });
  expect(scientist.id).toBeGreaterThan(0);
});

describe('observatories and transit windows', () => {
  it('adds observatories, refusing a duplicate name or a latitude off the Earth', async () => {
    const { browser } = await signedIn(test, 'scientist');
    // The check site: latitude 31.9583°, longitude −111.5967°, 2096 m.
    const added = await browser.post('/api/observatories', {
      name: 'Desert ridge 0.6 m',
      latitudeDeg: 31.9583,
      longitudeDeg: -111.5967,
      elevationM: 2096,
    });
    expect(added.status).toBe(201);
    expect(added.body.observatory).toMatchObject({ minTargetAltitudeDeg: 30, sunAltitudeLimitDeg: -12 });
    expect(
      (
        await browser.post('/api/observatories', {
          name: 'Desert ridge 0.6 m',
          latitudeDeg: 0,
          longitudeDeg: 0,
        })
      ).status,
    ).toBe(409);
    const bad = await browser.post('/api/observatories', {
      name: 'Nowhere',
      latitudeDeg: 95,
      longitudeDeg: 0,
    });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('latitudeDeg');
    expect((await browser.get('/api/observatories')).body.observatories).toHaveLength(1);
  });

  it('answers the next windows with their uncertainty and, per observatory, whether each can be watched', async () => {
    const { browser } = await signedIn(test, 'scientist');
    const answer = await browser.get(`/api/candidates/${candidateId}/windows?count=5`);
    expect(answer.status).toBe(200);
    const { windows, cautions } = answer.body;
    expect(windows.length).toBeGreaterThan(0);
    expect(cautions.join(' ')).toMatch(/not a confirmed planet/);
    expect(cautions.join(' ')).toMatch(/30° to the Sun/);
    for (const window of windows) {
      // σ_Tn = sqrt(σ_T0² + n² σ_P²), and the window is the transit padded by it.
      const sigma = Math.sqrt(0.0005 ** 2 + (window.epoch * 0.00002) ** 2);
      expect(window.sigmaDays).toBeCloseTo(sigma, 10);
      // To 1e-8 d (1 ms): a BJD near 2.46e6 keeps about 1e-10 d of a difference of two doubles.
      expect(window.endBjdTdb - window.startBjdTdb).toBeCloseTo(2.5 / 24 + 2 * sigma, 8);
      expect(Date.parse(window.endUtc) - Date.parse(window.startUtc)).toBeGreaterThan(0);
      expect(window.observatories).toHaveLength(1);
      expect(typeof window.observatories[0].observable).toBe('boolean');
      expect(window.observatories[0].reason.length).toBeGreaterThan(0);
      expect(window.sunSeparationDeg).toBeGreaterThanOrEqual(30);
    }
  });

  it('leaves out windows with the target within 30° of the Sun, and says how many', async () => {
    const lateFebruary = await candidateWindows(test.db, candidateId, 6, new Date('2026-02-18T00:00:00Z'));
    expect(lateFebruary.leftOutNearSun).toBeGreaterThan(0);
    for (const window of lateFebruary.windows) expect(window.sunSeparationDeg).toBeGreaterThanOrEqual(30);
    const september = await candidateWindows(test.db, candidateId, 6, new Date('2026-09-01T00:00:00Z'));
    expect(september.leftOutNearSun).toBe(0);
    expect(september.windows).toHaveLength(6);
  });

  it('answers 409 for a single transit (no period), 404 for nobody, 400 for a bad count, 403 for volunteers', async () => {
    const { browser } = await signedIn(test, 'scientist');
    const single = await browser.get(`/api/candidates/${singleTransitId}/windows`);
    expect(single.status).toBe(409);
    expect(single.body.error.code).toBe('no_ephemeris');
    expect((await browser.get('/api/candidates/999999/windows')).status).toBe(404);
    expect((await browser.get(`/api/candidates/${candidateId}/windows?count=0`)).status).toBe(400);
    const volunteer = (await signedIn(test, 'volunteer')).browser;
    expect((await volunteer.get(`/api/candidates/${candidateId}/windows`)).status).toBe(403);
  });

  it('changes and removes an observatory, refusing a taken name, an empty change and a latitude off the Earth', async () => {
    const { browser } = await signedIn(test, 'scientist');
    const spare = await browser.post('/api/observatories', {
      name: 'Spare dome',
      latitudeDeg: 10,
      longitudeDeg: 20,
    });
    expect(spare.status).toBe(201);
    const id = spare.body.observatory.id;
    const changed = await browser.patch(`/api/observatories/${id}`, {
      minTargetAltitudeDeg: 40,
      elevationM: 900,
    });
    expect(changed.status).toBe(200);
    expect(changed.body.observatory).toMatchObject({
      name: 'Spare dome',
      minTargetAltitudeDeg: 40,
      elevationM: 900,
      sunAltitudeLimitDeg: -12,
    });
    const taken = await browser.patch(`/api/observatories/${id}`, { name: 'Desert ridge 0.6 m' });
    expect(taken.status).toBe(409);
    expect(taken.body.error.fields).toHaveProperty('name');
    expect((await browser.patch(`/api/observatories/${id}`, {})).status).toBe(400);
    const off = await browser.patch(`/api/observatories/${id}`, { latitudeDeg: -91 });
    expect(off.status).toBe(400);
    expect(off.body.error.fields).toHaveProperty('latitudeDeg');
    expect((await browser.patch('/api/observatories/999999', { name: 'x' })).status).toBe(404);
    const volunteer = (await signedIn(test, 'volunteer')).browser;
    expect((await volunteer.delete(`/api/observatories/${id}`)).status).toBe(403);

    expect((await browser.delete(`/api/observatories/${id}`)).status).toBe(200);
    expect((await browser.delete(`/api/observatories/${id}`)).status).toBe(404);
    const names = (await browser.get('/api/observatories')).body.observatories.map(
      (observatory: { name: string }) => observatory.name,
    );
    expect(names).toEqual(['Desert ridge 0.6 m']);
    const actions = await test
      .db('audit_log')
      .where({ entity_type: 'observatory', entity_id: String(id) })
      .pluck('action');
    expect(actions.sort()).toEqual(['observatory.changed', 'observatory.created', 'observatory.removed']);
  });
});
