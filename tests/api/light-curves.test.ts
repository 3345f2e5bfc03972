import fs from 'node:fs';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { type Browser, createTestApp, signedIn, type TestApp } from './support/test-app';

// Light curves from tests/reference/make_reference.py (invented stars, written by astropy 5.2.1).
const fixtures = path.resolve(import.meta.dirname, '../fixtures/reference');
const HOT_JUPITER_FITS = path.join(fixtures, 'hot-jupiter.fits'); // OBJECT = DPD-0417-3021
const SHALLOW_CSV = path.join(fixtures, 'shallow-transit.csv');
const CATALOGUE = [
  'designation,ra,dec,magnitude,stellar_radius,stellar_mass,teff',
  'DPD-0417-3021,14:29:42.9,-62:40:46,11.2,1.1,1.05,5900',
  'DPD-1188-0754,243.5,52.1,12.8,,,',
  'DPD-BAD,400,0,10,1,1,5000',
  ',10,10,10,1,1,5000',
].join('\n');

let test: TestApp;
let scientist: Browser;
let campaignId: number;

async function upload(files: string[], fields: Record<string, string> = {}, id = campaignId) {
  const token = await scientist.csrf();
  const call = scientist.agent.post(`/api/campaigns/${id}/light-curves`).set('X-CSRF-Token', token);
  for (const [name, value] of Object.entries(fields)) call.field(name, value);
  for (const file of files) call.attach('files', file);
  return call;
}

async function uploadBuffer(name: string, content: Buffer, fields: Record<string, string> = {}) {
  const token = await scientist.csrf();
  const call = scientist.agent.post(`/api/campaigns/${campaignId}/light-curves`).set('X-CSRF-Token', token);
  for (const [key, value] of Object.entries(fields)) call.field(key, value);
  return call.attach('files', content, name);
}

async function finished(uploadId: number) {
  for (let i = 0; i < 400; i += 1) {
    const response = await scientist.get(`/api/uploads/${uploadId}`);
    if (response.body.status === 'done' || response.body.status === 'failed') return response.body;
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  throw new Error(`upload ${uploadId} did not finish`);
}

beforeAll(async () => {
  test = await createTestApp({ queues: true });
  ({ browser: scientist } = await signedIn(test, 'scientist'));
  campaignId = (await scientist.post('/api/campaigns', { name: 'Upload tests' })).body.campaign.id;
});

describe('POST /api/campaigns/:id/targets', () => {
  it('inserts the catalogue with a report per row: sexagesimal read, defaults marked assumed, bad rows rejected', async () => {
    const token = await scientist.csrf();
    const response = await scientist.agent
      .post(`/api/campaigns/${campaignId}/targets`)
      .set('X-CSRF-Token', token)
      .attach('file', Buffer.from(CATALOGUE), 'catalogue.csv');
    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ created: 2, updated: 0, rejected: 2 });
    expect(response.body.rows.find((r: { line: number }) => r.line === 3).assumed).toEqual([
      'stellarRadiusRsun',
      'stellarMassMsun',
      'teffK',
    ]);
    expect(response.body.rows.find((r: { line: number }) => r.line === 4).reason).toMatch(
      /RA must be between/,
    );
    expect(response.body.rows.find((r: { line: number }) => r.line === 5).reason).toBe('no designation');
    const list = await scientist.get(`/api/campaigns/${campaignId}/targets`);
    const star = list.body.targets.find((t: { designation: string }) => t.designation === 'DPD-0417-3021');
    // 14h29m42.9s = 15 × 14.495250 h = 217.42875°; −62°40′46″ = −62.679444° (sexagesimal arithmetic).
    expect(star.raDeg).toBeCloseTo(217.42875, 5);
    expect(star.decDeg).toBeCloseTo(-62.679444, 5);
  });

  it('updates by designation the second time, and refuses a file with no designation column', async () => {
    const token = await scientist.csrf();
    const again = await scientist.agent
      .post(`/api/campaigns/${campaignId}/targets`)
      .set('X-CSRF-Token', token)
      .attach('file', Buffer.from(CATALOGUE), 'catalogue.csv');
    expect(again.body).toMatchObject({ created: 0, updated: 2 });
    const bad = await scientist.agent
      .post(`/api/campaigns/${campaignId}/targets`)
      .set('X-CSRF-Token', token)
      .attach('file', Buffer.from('ra,dec\n1,2\n'), 'catalogue.csv');
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/no designation column/);
  });

  it('takes three imports of the same new stars at once: one creates each star, the others update it', async () => {
    // On PostgreSQL the imports run side by side; SQLite runs them one after another.
    const id = (await scientist.post('/api/campaigns', { name: 'Imported at once' })).body.campaign.id;
    const stars = Array.from({ length: 40 }, (_, i) => `DPD-7100-${String(i).padStart(4, '0')},10.5,-20.25`);
    const csv = Buffer.from(['designation,ra,dec', ...stars].join('\n'));
    const token = await scientist.csrf();
    const send = () =>
      scientist.agent
        .post(`/api/campaigns/${id}/targets`)
        .set('X-CSRF-Token', token)
        .attach('file', csv, 'catalogue.csv');
    const imports = await Promise.all([send(), send(), send()]);
    expect(imports.map((response) => response.status)).toEqual([200, 200, 200]);
    const created = imports.reduce((sum, response) => sum + response.body.created, 0);
    const updated = imports.reduce((sum, response) => sum + response.body.updated, 0);
    expect({ created, updated }).toEqual({ created: 40, updated: 80 });
    const [stored] = await test.db('targets').where({ campaign_id: id }).count({ n: '*' });
    expect(Number(stored?.n)).toBe(40);
  });
});

describe('POST /api/campaigns/:id/light-curves', () => {
  it('takes a FITS and a CSV file, answers 202 with one upload id each, and ingests both to done', async () => {
    const fits = await upload([HOT_JUPITER_FITS]);
    const csv = await upload([SHALLOW_CSV], { target: 'DPD-1188-0754' });
    expect(fits.status).toBe(202);
    expect(csv.status).toBe(202);
    const [fitsUpload] = fits.body.uploads;
    const [csvUpload] = csv.body.uploads;
    expect(fitsUpload).toMatchObject({ fileName: 'hot-jupiter.fits', status: 'queued', duplicate: false });
    const fitsDone = await finished(fitsUpload.id);
    const csvDone = await finished(csvUpload.id);
    expect(fitsDone).toMatchObject({
      status: 'done',
      stage: 'done',
      progress: 1,
      error: null,
      targetDesignation: 'DPD-0417-3021',
    });
    expect(fitsDone.snippetCount).toBeGreaterThan(10);
    expect(csvDone.status).toBe('done');
    const stored = fs.readdirSync(path.join(test.dataDir, 'uploads')).filter((name) => name !== 'incoming');
    expect(stored).toHaveLength(2); // kept by content hash, under the data directory
  });

  it('recognises the same file uploaded again and does not ingest it twice', async () => {
    const before = await test.db('snippets').count({ n: '*' });
    const again = await upload([HOT_JUPITER_FITS]);
    expect(again.status).toBe(202);
    expect(again.body.uploads[0].duplicate).toBe(true);
    expect(await test.db('snippets').count({ n: '*' })).toEqual(before);
  });

  it('lists the snippets, filters them by kind and target, and shows one with its series', async () => {
    const all = await scientist.get(`/api/campaigns/${campaignId}/snippets?pageSize=200&sort=timeStart`);
    expect(all.status).toBe(200);
    expect(all.body.total).toBeGreaterThan(20);
    const planted = await scientist.get(`/api/campaigns/${campaignId}/snippets?kind=planted`);
    expect(planted.body.snippets.every((s: { kind: string }) => s.kind === 'planted')).toBe(true);
    const oneTarget = await scientist.get(
      `/api/campaigns/${campaignId}/snippets?target=DPD-1188-0754&pageSize=200`,
    );
    expect(
      oneTarget.body.snippets.every((s: { designation: string }) => s.designation === 'DPD-1188-0754'),
    ).toBe(true);
    const first = all.body.snippets.find((s: { designation: string }) => s.designation === 'DPD-0417-3021');
    const one = await scientist.get(`/api/snippets/${first.id}`);
    expect(one.body.snippet.display.flux.length).toBeGreaterThan(100);
    expect(one.body.snippet.display.flux.length).toBeLessThanOrEqual(600);
    const target = await scientist.get(`/api/targets/${first.targetId}`);
    expect(target.body.lightCurves).toHaveLength(1);
    expect(target.body.lightCurves[0].timeSystem).toMatchObject({ timesys: 'TDB', timeref: 'SOLARSYSTEM' });
    expect(target.body.snippets.length).toBeGreaterThan(5);
    const bad = await scientist.get(`/api/campaigns/${campaignId}/snippets?sort=colour`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.sort).toBeDefined();
  });

  it('lets a scientist mark a real snippet quiet (a quiet control), once, on the record', async () => {
    const real = await scientist.get(`/api/campaigns/${campaignId}/snippets?kind=real&pageSize=1`);
    const id = real.body.snippets[0].id;
    const marked = await scientist.post(`/api/snippets/${id}/quiet`);
    expect(marked.status).toBe(200);
    expect(marked.body.snippet.kind).toBe('quiet');
    expect((await scientist.post(`/api/snippets/${id}/quiet`)).status).toBe(409);
    const audit = await test.db('audit_log').where({ action: 'snippet.marked_quiet', entity_id: String(id) });
    expect(audit).toHaveLength(1);
    const { browser: moderator } = await signedIn(test, 'moderator');
    expect((await moderator.post(`/api/snippets/${id}/quiet`)).status).toBe(403);
  });

  it('fails an upload whose file cannot be read, with the reader’s message, and leaves the rest as it was', async () => {
    const before = await test.db('light_curves').count({ n: '*' });
    const noFlux = await uploadBuffer(
      'no-flux.csv',
      Buffer.from('time,brightness_of_something\n1,2\n2,3\n'),
      {
        target: 'DPD-1188-0754',
      },
    );
    expect(noFlux.status).toBe(202);
    const failed = await finished(noFlux.body.uploads[0].id);
    expect(failed.status).toBe('failed');
    expect(failed.error).toMatch(/flux/i);
    const unordered = [
      'time,flux,flux_err',
      ...Array.from({ length: 50 }, (_, i) => `${i === 25 ? 3 : i + 10},1,0.001`),
    ].join('\n');
    const badTimes = await finished(
      (await uploadBuffer('unordered.csv', Buffer.from(unordered), { target: 'DPD-1188-0754' })).body
        .uploads[0].id,
    );
    expect(badTimes.error).toMatch(/increasing order/);
    const nanFlux = ['time,flux', ...Array.from({ length: 50 }, (_, i) => `${i},nan`)].join('\n');
    const allNan = await finished(
      (await uploadBuffer('nan.csv', Buffer.from(nanFlux), { target: 'DPD-1188-0754' })).body.uploads[0].id,
    );
    expect(allNan.error).toMatch(/finite|NaN/i);
    // A FITS file with only a primary header and no table (FITS Standard 4.0: 2880-byte header blocks).
    const card = (text: string) => text.padEnd(80, ' ');
    const primaryOnly = Buffer.from(
      [
        card('SIMPLE  =                    T'),
        card('BITPIX  =                    8'),
        card('NAXIS   =                    0'),
        card('END'),
      ]
        .join('')
        .padEnd(2880, ' '),
      'latin1',
    );
    const noTable = await finished(
      (await uploadBuffer('no-table.fits', primaryOnly, { target: 'DPD-1188-0754' })).body.uploads[0].id,
    );
    expect(noTable.status).toBe('failed');
    expect(noTable.error).toMatch(/table/i);
    const notFits = await finished(
      (await uploadBuffer('broken.fits', Buffer.from(`SIMPLE  =${' '.repeat(100)}`))).body.uploads[0].id,
    );
    expect(notFits.status).toBe('failed');
    expect(await test.db('light_curves').count({ n: '*' })).toEqual(before);
  });

  it('refuses a file over 100 MB with 413 and keeps none of it', async () => {
    const big = path.join(test.dataDir, 'too-big.csv');
    fs.writeFileSync(big, 'time,flux\n');
    fs.truncateSync(big, 100 * 1024 * 1024 + 1); // sparse: quick to make
    const response = await upload([big]);
    expect(response.status).toBe(413);
    expect(fs.readdirSync(path.join(test.dataDir, 'uploads', 'incoming'))).toEqual([]);
    fs.rmSync(big);
  });

  it('refuses, before storing anything: wrong type (415), empty file, unknown target, a NUL in a file name (400), closed campaign (409), volunteer (403)', async () => {
    const uploadsBefore = await test.db('uploads').count({ n: '*' });
    const image = await uploadBuffer('picture.png', Buffer.from([0x89, 0x50, 0x4e, 0x47, 0, 0, 0, 0]));
    expect(image.status).toBe(415);
    const empty = await uploadBuffer('empty.csv', Buffer.alloc(0));
    expect(empty.status).toBe(400);
    expect(empty.body.error.code).toBe('empty_file');
    const unknown = await upload([SHALLOW_CSV], { target: 'DPD-9999-0000' });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.fields.target).toBeDefined();
    // A part header may name its file in RFC 5987 form, which can spell U+0000 (PostgreSQL's text cannot hold it).
    const boundary = 'dipdeck-test-boundary';
    const nulName = await scientist.agent
      .post(`/api/campaigns/${campaignId}/light-curves`)
      .set('X-CSRF-Token', await scientist.csrf())
      .set('Content-Type', `multipart/form-data; boundary=${boundary}`)
      .send(
        [
          `--${boundary}`,
          `Content-Disposition: form-data; name="files"; filename*=UTF-8''star%00one.csv`,
          'Content-Type: text/csv',
          '',
          fs.readFileSync(SHALLOW_CSV, 'utf8'),
          `--${boundary}--`,
          '',
        ].join('\r\n'),
      );
    expect(nulName.status).toBe(400);
    expect(nulName.body.error.fields.files).toMatch(/NUL/);
    const json = await scientist.post(`/api/campaigns/${campaignId}/light-curves`, { files: [] });
    expect(json.status).toBe(415);
    const closedId = (await scientist.post('/api/campaigns', { name: 'Closed one' })).body.campaign.id;
    await scientist.patch(`/api/campaigns/${closedId}`, { status: 'closed' });
    const closed = await upload([SHALLOW_CSV], {}, closedId);
    expect(closed.status).toBe(409);
    const { browser: volunteer } = await signedIn(test, 'volunteer');
    const token = await volunteer.csrf();
    // A small file: the 403 comes before the body is read, and supertest closes its server once it
    // has answered, which cuts off a body still being written (EPIPE).
    const refused = await volunteer.agent
      .post(`/api/campaigns/${campaignId}/light-curves`)
      .set('X-CSRF-Token', token)
      .attach('files', Buffer.from('time,flux\n1,1\n'), 'small.csv');
    expect(refused.status).toBe(403);
    expect(await test.db('uploads').count({ n: '*' })).toEqual(uploadsBefore);
    expect(fs.readdirSync(path.join(test.dataDir, 'uploads', 'incoming'))).toEqual([]);
  });
});
