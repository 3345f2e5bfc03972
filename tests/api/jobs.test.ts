import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { enqueue } from '../../worker/queues';
import { createTestApp, signedIn, type TestApp } from './support/test-app';

let test: TestApp;
beforeAll(async () => {
  test = await createTestApp({ queues: true });
});

async function settled(ref: string, states = ['completed', 'failed']): Promise<string> {
  const [queueName, id] = [ref.slice(0, ref.indexOf(':')), ref.slice(ref.indexOf(':') + 1)];
  const queue = test.queues!.all().find((q) => q.name === queueName)!;
  for (let i = 0; i < 300; i += 1) {
    const state = await (await queue.getJob(id))?.getState();
    if (state && states.includes(state)) return state;
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  const job = await queue.getJob(id);
  throw new Error(`job ${ref} did not settle: ${await job?.getState()} ${JSON.stringify(job?.toJSON())}`);
}

describe('GET /api/jobs/:id', () => {
  it('shows the person who started a job its state and progress; refuses volunteers and other staff', async () => {
    const { browser: starter, person } = await signedIn(test, 'scientist');
    const ref = await enqueue(test.queues!, 'housekeeping', 'sweep', { requestedBy: person.id });
    expect(await settled(ref)).toBe('completed');

    const mine = await starter.get(`/api/jobs/${ref}`);
    expect(mine.status).toBe(200);
    expect(mine.body.job).toMatchObject({
      id: ref,
      queue: 'housekeeping',
      name: 'sweep',
      state: 'completed',
    });
    expect(mine.body.job.progress).toEqual({ percent: expect.any(Number), stage: null });
    expect(mine.body.job).not.toHaveProperty('data');

    const { browser: volunteer } = await signedIn(test, 'volunteer');
    expect((await volunteer.get(`/api/jobs/${ref}`)).status).toBe(403);
    const { browser: otherStaff } = await signedIn(test, 'moderator');
    const other = await otherStaff.get(`/api/jobs/${ref}`);
    expect(other.status).toBe(403);
    expect(other.body.error.code).toBe('not_your_job');
    const { browser: admin } = await signedIn(test, 'admin');
    expect((await admin.get(`/api/jobs/${ref}`)).status).toBe(200);
    expect((await request(test.app).get(`/api/jobs/${ref}`)).status).toBe(401);
  });

  it('answers 404 for a job that does not exist and 400 for an id that names no queue', async () => {
    const { browser } = await signedIn(test, 'admin');
    expect((await browser.get('/api/jobs/housekeeping:999999')).status).toBe(404);
    const bad = await browser.get('/api/jobs/nonsense');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.id).toBeDefined();
  });
});

describe('Admin: queues and failed jobs', () => {
  it('counts jobs per queue and state, lists failed jobs with their error, and retries one', async () => {
    const { browser: admin, person } = await signedIn(test, 'admin');
    // A job name the housekeeping processor does not know fails on every attempt.
    const job = await test.queues!.byKey.housekeeping.add(
      'no-such-task',
      { requestedBy: person.id },
      { attempts: 1 },
    );
    const ref = `housekeeping:${job.id}`;
    expect(await settled(ref)).toBe('failed');

    const summary = await admin.get('/api/admin/queues');
    expect(summary.status).toBe(200);
    expect(summary.body.backend).toBe('embedded');
    expect(summary.body.queues.map((q: { name: string }) => q.name)).toEqual([
      'ingest',
      'consensus',
      'period-search',
      'mail',
      'housekeeping',
    ]);
    const housekeeping = summary.body.queues.find((q: { name: string }) => q.name === 'housekeeping');
    expect(housekeeping.counts.failed).toBe(1);

    const failed = await admin.get('/api/admin/jobs?state=failed');
    expect(failed.status).toBe(200);
    expect(failed.body.jobs[0]).toMatchObject({
      id: ref,
      state: 'failed',
      error: 'housekeeping has no job named no-such-task',
    });

    const retry = await admin.post(`/api/admin/jobs/${ref}/retry`);
    expect(retry.status).toBe(202);
    expect(retry.body.job.id).toBe(ref);
    expect(await settled(ref)).toBe('failed');
    const audit = await test.db('audit_log').where({ action: 'job.retried', entity_id: ref });
    expect(audit).toHaveLength(1);
  });

  it('will not retry a job that has not failed (409), and refuses a scientist (403)', async () => {
    const { browser: admin } = await signedIn(test, 'admin');
    const ref = await enqueue(test.queues!, 'housekeeping', 'sweep', {});
    expect(await settled(ref)).toBe('completed');
    const retry = await admin.post(`/api/admin/jobs/${ref}/retry`);
    expect(retry.status).toBe(409);
    expect(retry.body.error.code).toBe('not_failed');
    const { browser: scientist } = await signedIn(test, 'scientist');
    expect((await scientist.get('/api/admin/queues')).status).toBe(403);
    expect((await scientist.post(`/api/admin/jobs/${ref}/retry`)).status).toBe(403);
  });

  it('answers 400 naming the field for an unknown state, queue or limit', async () => {
    const { browser: admin } = await signedIn(test, 'admin');
    for (const [query, field] of [
      ['state=exploded', 'state'],
      ['queue=nope', 'queue'],
      ['limit=1000', 'limit'],
    ]) {
      const response = await admin.get(`/api/admin/jobs?${query}`);
      expect(response.status, query).toBe(400);
      expect(response.body.error.fields[field!]).toBeDefined();
    }
  });
});

describe('GET /api/health with queues', () => {
  it('reports the embedded queues as ok', async () => {
    const response = await request(test.app).get('/api/health');
    expect(response.body.queue).toEqual({ status: 'ok', detail: 'embedded' });
  });
});
