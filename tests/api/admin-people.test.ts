import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { listAudit } from '../../server/db/audit-log';
import { createTestApp, personWithRole, signedIn, type TestApp } from './support/test-app';

let test: TestApp;
beforeAll(async () => {
  test = await createTestApp();
});

describe('GET /api/admin/people', () => {
  it('answers 401 to a visitor and 403 to a volunteer, a moderator and a scientist', async () => {
    expect((await request(test.app).get('/api/admin/people')).status).toBe(401);
    for (const role of ['volunteer', 'moderator', 'scientist'] as const) {
      const { browser } = await signedIn(test, role);
      const response = await browser.get('/api/admin/people');
      expect(response.status, role).toBe(403);
      expect(response.body.error.code).toBe('forbidden');
    }
  });

  it('lists people to an admin, with search and a role filter, and never shows password hashes', async () => {
    const { browser } = await signedIn(test, 'admin');
    await personWithRole(test.db, 'moderator', { email: 'findable.moderator@example.com' });
    const all = await browser.get('/api/admin/people?pageSize=100');
    expect(all.status).toBe(200);
    expect(all.body.total).toBeGreaterThanOrEqual(5);
    expect(JSON.stringify(all.body)).not.toMatch(/scrypt|password/i);
    const found = await browser.get('/api/admin/people?q=FINDABLE');
    expect(found.body.people.map((p: { email: string }) => p.email)).toEqual([
      'findable.moderator@example.com',
    ]);
    const moderators = await browser.get('/api/admin/people?role=moderator&pageSize=100');
    expect(moderators.body.people.every((p: { role: string }) => p.role === 'moderator')).toBe(true);
  });

  it('answers 400 naming the field for a bad role filter or page size', async () => {
    const { browser } = await signedIn(test, 'admin');
    const badRole = await browser.get('/api/admin/people?role=overlord');
    expect(badRole.status).toBe(400);
    expect(badRole.body.error.fields.role).toBeDefined();
    const badPage = await browser.get('/api/admin/people?pageSize=5000');
    expect(badPage.status).toBe(400);
    expect(badPage.body.error.fields.pageSize).toBeDefined();
  });
});

describe('PATCH /api/admin/people/:id', () => {
  it('lets an admin change a role, and writes the change to the audit log', async () => {
    const { browser, person: admin } = await signedIn(test, 'admin');
    const volunteer = await personWithRole(test.db, 'volunteer');
    const response = await browser.patch(`/api/admin/people/${volunteer.id}`, { role: 'moderator' });
    expect(response.status).toBe(200);
    expect(response.body.person.role).toBe('moderator');
    const { entries } = await listAudit(test.db, {
      entityId: String(volunteer.id),
      action: 'person.role_changed',
      limit: 10,
      offset: 0,
    });
    expect(entries).toHaveLength(1);
    expect(entries[0]).toMatchObject({
      actorId: admin.id,
      before: { role: 'volunteer' },
      after: { role: 'moderator' },
    });
  });

  it('refuses a scientist with 403 and leaves the role as it was', async () => {
    const { browser } = await signedIn(test, 'scientist');
    const volunteer = await personWithRole(test.db, 'volunteer');
    const response = await browser.patch(`/api/admin/people/${volunteer.id}`, { role: 'admin' });
    expect(response.status).toBe(403);
    const row = await test.db('people').where({ id: volunteer.id }).first();
    expect(row.role).toBe('volunteer');
  });

  it('suspends and restores an account; a suspended person can still read "me", marked suspended', async () => {
    const { browser: admin } = await signedIn(test, 'admin');
    const { browser: moderatorBrowser, person: moderator } = await signedIn(test, 'moderator');
    const suspend = await admin.patch(`/api/admin/people/${moderator.id}`, {
      suspended: true,
      reason: 'testing',
    });
    expect(suspend.status).toBe(200);
    expect(suspend.body.person.suspended).toBe(true);
    const me = await moderatorBrowser.get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.person.suspended).toBe(true);
    const restore = await admin.patch(`/api/admin/people/${moderator.id}`, { suspended: false });
    expect(restore.body.person.suspended).toBe(false);
    const actions = await test
      .db('audit_log')
      .where({ entity_id: String(moderator.id) })
      .pluck('action');
    expect(actions).toEqual(['person.suspended', 'person.restored']);
  });

  it('does not let an admin demote or suspend themself', async () => {
    const { browser, person } = await signedIn(test, 'admin');
    const demote = await browser.patch(`/api/admin/people/${person.id}`, { role: 'volunteer' });
    expect(demote.status).toBe(409);
    expect(demote.body.error.code).toBe('cannot_change_self');
    const suspend = await browser.patch(`/api/admin/people/${person.id}`, { suspended: true });
    expect(suspend.status).toBe(409);
  });

  it('answers 400 for a bad id, an unknown role, an empty change or an unknown field; 404 for nobody', async () => {
    const { browser } = await signedIn(test, 'admin');
    const volunteer = await personWithRole(test.db, 'volunteer');
    expect(
      (await browser.patch('/api/admin/people/abc', { role: 'moderator' })).body.error.fields.id,
    ).toBeDefined();
    const badRole = await browser.patch(`/api/admin/people/${volunteer.id}`, { role: 'overlord' });
    expect(badRole.status).toBe(400);
    expect(badRole.body.error.fields.role).toBeDefined();
    expect((await browser.patch(`/api/admin/people/${volunteer.id}`, {})).status).toBe(400);
    expect((await browser.patch(`/api/admin/people/${volunteer.id}`, { password: 'x' })).status).toBe(400);
    const nobody = await browser.patch('/api/admin/people/999999', { role: 'moderator' });
    expect(nobody.status).toBe(404);
  });
});

describe('API conventions', () => {
  it('answers an unknown API path with a JSON 404', async () => {
    const response = await request(test.app).get('/api/no-such-thing');
    expect(response.status).toBe(404);
    expect(response.body.error.code).toBe('not_found');
  });

  it('reports database and queue status at GET /api/health, uncached and without X-Powered-By', async () => {
    const response = await request(test.app).get('/api/health');
    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ status: 'ok', database: { status: 'ok' } });
    expect(response.body.queue.status).toBeDefined();
    expect(response.headers['cache-control']).toBe('no-store');
    expect(response.headers['x-powered-by']).toBeUndefined();
  });
});
