import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { listAudit } from '../../server/db/audit-log';
import { createTestApp, signedIn, type TestApp } from './support/test-app';

let test: TestApp;
beforeAll(async () => {
  test = await createTestApp();
});

describe('campaigns', () => {
  it('a scientist creates a draft campaign with defaults, reads it, and lists it', async () => {
    const { browser } = await signedIn(test, 'scientist');
    const created = await browser.post('/api/campaigns', {
      name: 'Northern field, season 2',
      plantedShare: 0.2,
    });
    expect(created.status).toBe(201);
    expect(created.body.campaign).toMatchObject({
      name: 'Northern field, season 2',
      status: 'draft',
      plantedShare: 0.2,
      quietShare: 0.05,
      snippetLengthDays: 2,
      snippetOverlap: 0.25,
      verdictsToSettle: 5,
      verdictsMax: 15,
      settleUpper: 0.95,
      settleLower: 0.05,
    });
    const id = created.body.campaign.id;
    const one = await browser.get(`/api/campaigns/${id}`);
    expect(one.body.campaign.counts).toEqual({
      targets: 0,
      lightCurves: 0,
      snippets: { open: 0, settled: 0, split: 0, ruled: 0 },
      controls: { planted: 0, quiet: 0 },
    });
    const list = await browser.get('/api/campaigns');
    expect(list.body.campaigns.map((c: { id: number }) => c.id)).toContain(id);
  });

  it('moves through draft → live → paused → live → closed, audit-logs each move, and keeps closed final', async () => {
    const { browser } = await signedIn(test, 'scientist');
    const id = (await browser.post('/api/campaigns', { name: 'Status walk' })).body.campaign.id;
    for (const status of ['live', 'paused', 'live', 'closed']) {
      const response = await browser.patch(`/api/campaigns/${id}`, { status });
      expect(response.status, status).toBe(200);
      expect(response.body.campaign.status).toBe(status);
    }
    const reopen = await browser.patch(`/api/campaigns/${id}`, { status: 'live' });
    expect(reopen.status).toBe(409);
    expect(reopen.body.error.code).toBe('status_not_allowed');
    const edit = await browser.patch(`/api/campaigns/${id}`, { name: 'Renamed' });
    expect(edit.status).toBe(409);
    expect(edit.body.error.code).toBe('campaign_closed');
    const moves = await listAudit(test.db, {
      entityId: String(id),
      action: 'campaign.status_changed',
      limit: 10,
      offset: 0,
    });
    expect(moves.entries.map((m) => (m.after as { status: string }).status).reverse()).toEqual([
      'live',
      'paused',
      'live',
      'closed',
    ]);
  });

  it('refuses settings out of range or that do not fit together, naming the field, and changes nothing', async () => {
    const { browser } = await signedIn(test, 'scientist');
    const id = (await browser.post('/api/campaigns', { name: 'Careful settings' })).body.campaign.id;
    const cases: [object, string][] = [
      [{ snippetLengthDays: 0 }, 'snippetLengthDays'],
      [{ plantedShare: 0.9 }, 'plantedShare'],
      [{ verdictsToSettle: 10, verdictsMax: 5 }, 'verdictsMax'],
      [{ settleLower: 0.5, settleUpper: 0.5 }, 'settleLower'],
      [{ plantedSnrMin: 20, plantedSnrMax: 10 }, 'plantedSnrMax'],
      [{ detrendWindowDays: 0.2 }, 'detrendWindowDays'],
      [{ status: 'finished' }, 'status'],
      [{ colour: 'blue' }, '_'],
    ];
    for (const [patch, field] of cases) {
      const response = await browser.patch(`/api/campaigns/${id}`, patch);
      expect(response.status, JSON.stringify(patch)).toBe(400);
      expect(Object.keys(response.body.error.fields ?? {}), JSON.stringify(patch)).toContain(field);
    }
    const after = await browser.get(`/api/campaigns/${id}`);
    expect(after.body.campaign).toMatchObject({ snippetLengthDays: 2, plantedShare: 0.1, verdictsMax: 15 });
    const created = await browser.post('/api/campaigns', { name: '' });
    expect(created.body.error.fields.name).toBeDefined();
  });

  it('answers 404 for an unknown campaign and 403 to volunteers and moderators, 401 to visitors', async () => {
    const { browser } = await signedIn(test, 'scientist');
    expect((await browser.get('/api/campaigns/99999')).status).toBe(404);
    for (const role of ['volunteer', 'moderator'] as const) {
      const { browser: other } = await signedIn(test, role);
      expect((await other.get('/api/campaigns')).status).toBe(403);
      expect((await other.post('/api/campaigns', { name: 'Nope' })).status).toBe(403);
    }
    expect((await request(test.app).get('/api/campaigns')).status).toBe(401);
  });
});
