// The campaign exports as an astronomer's tool sees them: astropy reads the VOTable with no warnings and
// the CSV with its comment lines, each says candidates are not confirmed planets, and every download is
// on the audit log.
import { execFileSync, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { createCampaign } from '../../seeds/factories/campaigns';
import { createPerson } from '../../seeds/factories/people';
import { createSnippetFixtures } from '../../seeds/factories/snippets';
import { nowIso } from '../../server/db/rows';
import { createTestApp, signedIn, type TestApp } from './support/test-app';

const PYTHON = '/usr/bin/python3';
const hasAstropy = spawnSync(PYTHON, ['-c', 'import astropy'], { stdio: 'ignore' }).status === 0;
if (process.env.CI && !hasAstropy) throw new Error('CI must provide Debian’s python3-astropy');

let test: TestApp;
let campaignId: number;

beforeAll(async () => {
  test = await createTestApp();
  campaignId = await createCampaign(test.db, { status: 'live', name: 'Export field' });
  const { snippetIds, targetIds } = await createSnippetFixtures(test.db, campaignId, { targets: 3, real: 6 });
  const now = nowIso();
  await test.db('snippets').whereIn('id', snippetIds.real.slice(0, 4)).update({
    state: 'settled',
    outcome: 'flat',
    consensus_score: 0.01,
    dip_share: 0,
    effective_votes: 5,
    verdict_count: 5,
  });
  await test
    .db('snippets')
    .where({ id: snippetIds.real[4] })
    .update({ state: 'ruled', outcome: 'dip', consensus_score: 0.6 });
  const [dip] = await test
    .db('dips')
    .insert({
      snippet_id: snippetIds.real[4],
      target_id: targetIds[1],
      campaign_id: campaignId,
      time_center: 1.25,
      time_sigma: 0.01,
      depth_ppm: 4200,
      duration_hours: 2.5,
      created_at: now,
      updated_at: now,
    })
    .returning('id');
  // A name that a spreadsheet would run as a formula.
  const finder = await createPerson(test.db, {
    displayName: '=HYPERLINK("x")',
    creditByName: true,
    reuseHash: true,
  });
  const dipId = Number(typeof dip === 'object' ? dip.id : dip);
  await test.db('dip_finders').insert({ dip_id: dipId, person_id: finder.id });
  const [candidate] = await test
    .db('candidates')
    .insert({
      campaign_id: campaignId,
      target_id: targetIds[1],
      state: 'promoted',
      disposition: 'planet candidate',
      period_days: 3.7,
      period_sigma_days: 0.00002,
      t0_bjd: 2459000.12345,
      t0_sigma_days: 0.0005,
      depth_ppm: 4200,
      duration_hours: 2.5,
      snr: 14,
      priority: 1.2,
      created_at: now,
      updated_at: now,
    })
    .returning('id');
  await test.db('candidate_dips').insert({
    candidate_id: Number(typeof candidate === 'object' ? candidate.id : candidate),
    dip_id: dipId,
  });
});

async function download(kind: 'follow-up' | 'consensus', format: string) {
  const { browser } = await signedIn(test, 'scientist');
  return browser.agent
    .get(`/api/campaigns/${campaignId}/${kind}?format=${format}`)
    .buffer(true)
    .parse((res, done) => {
      let text = '';
      res.setEncoding('utf8');
      res.on('data', (chunk: string) => {
        text += chunk;
      });
      res.on('end', () => done(null, text));
    });
}

describe('campaign exports', () => {
  it('serve the follow-up list in three formats, each with the caution, as attachments', async () => {
    for (const [format, type] of [
      ['csv', 'text/csv'],
      ['json', 'application/json'],
      ['votable', 'application/x-votable+xml'],
    ] as const) {
      const answer = await download('follow-up', format);
      expect(answer.status, format).toBe(200);
      expect(answer.headers['content-type']).toContain(type);
      expect(answer.headers['content-disposition']).toMatch(
        /^attachment; filename="dipdeck-campaign-\d+-follow-up\./,
      );
      expect(String(answer.body)).toMatch(/not confirmed planets/);
    }
    const json = JSON.parse(String((await download('follow-up', 'json')).body));
    expect(json.rows).toHaveLength(1);
    expect(json.rows[0]).toMatchObject({
      period: 3.7,
      t0_bjd_tdb: 2459000.12345,
      dip_count: 1,
      credited: '=HYPERLINK("x")',
    });
    // In the CSV the name is escaped against formula injection; numbers stay numbers.
    const csv = String((await download('follow-up', 'csv')).body);
    expect(csv).toContain(`"'=HYPERLINK(""x"")"`);
    expect(csv).toContain(',3.7,');
    expect(csv.split('\r\n').length).toBeGreaterThan(3);
  });

  it.skipIf(!hasAstropy)(
    'are read by astropy: the VOTable with no warnings and the same values and units',
    async () => {
      const dir = fs.mkdtempSync(path.join(test.dataDir, 'exports-'));
      for (const kind of ['follow-up', 'consensus'] as const) {
        const votable = path.join(dir, `${kind}.vot`);
        const csv = path.join(dir, `${kind}.csv`);
        fs.writeFileSync(votable, String((await download(kind, 'votable')).body));
        fs.writeFileSync(csv, String((await download(kind, 'csv')).body));
        const read = JSON.parse(
          execFileSync(PYTHON, ['tests/reference/check_exports.py', votable, csv], { encoding: 'utf8' }),
        );
        expect(read.votable.warnings, kind).toEqual([]);
        expect(read.csv.warnings, kind).toEqual([]);
        const fields = Object.fromEntries(
          read.votable.columns.map((field: { name: string }) => [field.name, field]),
        );
        const csvColumns = Object.fromEntries(
          read.csv.columns.map((column: { name: string; values: unknown[] }) => [column.name, column.values]),
        );
        expect(read.votable.version).toBe('1.4');
        expect(read.votable.infos.caution).toMatch(/not confirmed planets/);
        if (kind === 'follow-up') {
          expect(fields.period).toMatchObject({ unit: 'd', values: [3.7] });
          expect(fields.depth.unit).toBe('1e-06');
          expect(fields.t0_bjd_tdb.values).toEqual([2459000.12345]);
          expect(csvColumns.period).toEqual([3.7]);
        } else {
          expect(fields.snippet_id.values).toHaveLength(5);
          expect(fields.consensus_score.unit).toBeNull();
          expect((csvColumns.outcome as string[]).sort()).toEqual(['dip', 'flat', 'flat', 'flat', 'flat']);
        }
        for (const field of read.votable.columns) expect(field.ucdValid ?? true, field.name).toBe(true);
      }
    },
  );

  it('are audit-logged, refuse volunteers, and answer 400 for an unknown format and 404 for an unknown campaign', async () => {
    const before = Number(
      (await test.db('audit_log').where({ action: 'export.downloaded' }).count({ n: '*' }))[0]!.n,
    );
    await download('consensus', 'json');
    const after = Number(
      (await test.db('audit_log').where({ action: 'export.downloaded' }).count({ n: '*' }))[0]!.n,
    );
    expect(after).toBe(before + 1);
    const { browser } = await signedIn(test, 'scientist');
    const bad = await browser.get(`/api/campaigns/${campaignId}/consensus?format=xlsx`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('format');
    expect((await browser.get('/api/campaigns/999999/follow-up?format=csv')).status).toBe(404);
    const volunteer = (await signedIn(test, 'volunteer')).browser;
    expect((await volunteer.get(`/api/campaigns/${campaignId}/follow-up`)).status).toBe(403);
  });
});
