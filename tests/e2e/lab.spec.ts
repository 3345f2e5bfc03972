import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { setUpBrowserJourney } from './support/journey';

const journey = setUpBrowserJourney({
  touchSelector: 'button:visible, select:visible, nav a:visible, summary:visible, input[type=file]:visible',
  checkSideways: true,
  settleMs: 250,
});

const fixtures = path.resolve(import.meta.dirname, '../fixtures/reference');
// Reading a light curve runs in the server's own embedded worker; a FITS file of a few thousand points
// takes seconds, but a busy test machine may be slow.
const ingestTimeoutMs = 60_000;

// The designations the fixtures observe: hot-jupiter.fits names DPD-0417-3021 in its OBJECT keyword;
// shallow-transit.csv names nothing, so the form says which target it is.
const catalogue = [
  'designation,ra,dec,magnitude,stellar_radius,stellar_mass,teff',
  'DPD-0417-3021,04:17:21.5,-30:21:08,11.2,1.05,1.02,5840',
  'DPD-1188-0754,118.8,-7.54,12.6,,,',
  ',10,10,12,1,1,5000',
].join('\n');

let workDir: string;

beforeAll(async () => {
  workDir = mkdtempSync(path.join(tmpdir(), 'dipdeck-lab-e2e-'));
});

afterAll(async () => {
  if (workDir) rmSync(workDir, { recursive: true, force: true });
});

async function expectPlotDrawn() {
  const plot = journey.page.locator('.light-curve-plot canvas').first();
  await plot.waitFor();
  const box = await plot.boundingBox();
  expect(box?.width ?? 0, 'plot width').toBeGreaterThan(150);
  expect(box?.height ?? 0, 'plot height').toBeGreaterThan(100);
}

async function uploadLightCurve(filePath: string, target: string) {
  const form = journey.page.getByRole('region', { name: 'Light curves' });
  await form.getByLabel('Light-curve files').setInputFiles(filePath);
  if (target) await form.getByRole('combobox', { name: 'Target' }).fill(target);
  await form.getByRole('button', { name: 'Upload light curves' }).click();
  await journey.page.getByRole('progressbar', { name: `Progress of ${path.basename(filePath)}` }).waitFor();
}

describe('the Lab', () => {
  it('a scientist creates a campaign, uploads targets and light curves, watches them read, opens a target and sets the campaign live', async () => {
    await journey.signIn('scientist@demo.dipdeck.test');
    await journey.page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link', { name: 'Lab', exact: true })
      .click();
    await journey.page.getByRole('heading', { level: 1, name: 'Campaigns' }).waitFor();
    await journey.page.getByRole('table', { name: 'Campaigns, newest first' }).waitFor();
    await journey.screenshots('lab-campaigns');

    // A name is required: the form says so beside the field, without asking the server.
    await journey.page.getByRole('link', { name: 'New campaign' }).first().click();
    await journey.page.getByRole('heading', { level: 1, name: 'New campaign' }).waitFor();
    await journey.page.getByRole('button', { name: 'Create campaign' }).click();
    expect(await journey.page.getByRole('textbox', { name: 'Name' }).getAttribute('aria-invalid')).toBe(
      'true',
    );

    const name = `Southern dwarfs ${Date.now()}`;
    await journey.page.getByRole('textbox', { name: 'Name' }).fill(name);
    await journey.page.getByLabel('Description').fill('Two invented stars observed for the browser test.');
    await journey.page.getByRole('button', { name: 'Create campaign' }).click();
    await journey.page.getByRole('heading', { level: 1, name }).waitFor();
    expect(new URL(journey.page.url()).pathname).toMatch(/^\/lab\/campaigns\/\d+$/);
    await journey.page
      .getByText('Changing the settings of a live campaign affects only snippets made afterwards')
      .waitFor();

    // The catalogue: two stars, one with the stellar parameters left out, and one row without a name.
    const cataloguePath = path.join(workDir, 'targets.csv');
    writeFileSync(cataloguePath, catalogue);
    const catalogueSection = journey.page.getByRole('region', { name: 'Target catalogue' });
    await catalogueSection.getByLabel('Catalogue file').setInputFiles(cataloguePath);
    await catalogueSection.getByRole('button', { name: 'Upload catalogue' }).click();
    const report = journey.page.getByRole('table', { name: 'Row by row report on targets.csv' });
    await report.waitFor();
    expect(await report.getByRole('row').filter({ hasText: 'Accepted' }).count()).toBe(2);
    expect(await report.getByRole('row').filter({ hasText: 'Rejected' }).count()).toBe(1);
    await report
      .getByRole('row')
      .filter({ hasText: 'DPD-1188-0754' })
      .getByText('stellar radius assumed')
      .waitFor();
    const targets = journey.page.getByRole('table', { name: 'Targets in this campaign' });
    await targets.getByRole('link', { name: 'DPD-0417-3021' }).waitFor();
    await targets.getByRole('link', { name: 'DPD-1188-0754' }).waitFor();

    // One target a request: the FITS file names its star, the CSV gets one from the form.
    await uploadLightCurve(path.join(fixtures, 'hot-jupiter.fits'), '');
    await uploadLightCurve(path.join(fixtures, 'shallow-transit.csv'), 'DPD-1188-0754');
    for (const file of ['hot-jupiter.fits', 'shallow-transit.csv']) {
      const bar = journey.page.getByRole('progressbar', { name: `Progress of ${file}` });
      await journey.page.waitForFunction(
        (label) => {
          const element = document.querySelector(`[role="progressbar"][aria-label="${label}"]`);
          const now = element?.getAttribute('aria-valuenow');
          const item = element?.closest('[data-status]');
          if (item?.getAttribute('data-status') === 'failed') throw new Error(`${label} failed`);
          return now === '100' && item?.getAttribute('data-status') === 'done';
        },
        `Progress of ${file}`,
        { timeout: ingestTimeoutMs, polling: 250 },
      );
      expect(await bar.getAttribute('aria-valuetext')).toMatch(/^Done/);
    }
    const recent = journey.page.getByRole('table', { name: 'Recent light-curve uploads, newest first' });
    await recent.getByRole('row').filter({ hasText: 'hot-jupiter.fits' }).getByText('Done').waitFor();
    await recent
      .getByRole('row')
      .filter({ hasText: 'shallow-transit.csv' })
      .getByText('DPD-1188-0754')
      .waitFor();
    await journey.screenshots('lab-campaign');

    // The snippet browser: the campaign's snippets, and a light-curve preview of the one chosen.
    const campaignPath = new URL(journey.page.url()).pathname;
    await journey.page.getByRole('link', { name: /^Browse .* snippets$/ }).click();
    await journey.page.getByRole('heading', { level: 1, name: `Snippets of ${name}` }).waitFor();
    const snippetTable = journey.page.getByRole('table', { name: 'Snippets of this campaign' });
    await snippetTable.waitFor();
    await journey.page.getByLabel('Kind').selectOption('planted');
    await journey.page.waitForFunction(() =>
      [...document.querySelectorAll('tbody tr')].every((row) => row.textContent?.includes('Planted')),
    );
    await snippetTable
      .getByRole('button', { name: /^Preview snippet/ })
      .first()
      .click();
    await journey.page.getByText('Planted transit (staff only)').waitFor();
    await expectPlotDrawn();
    await journey.screenshots('lab-snippets', expectPlotDrawn);

    // The target journey.page: the whole light curve, zoomable, with the snippets cut from it.
    await journey.page.goto(journey.url(campaignPath));
    await journey.page
      .getByRole('table', { name: 'Targets in this campaign' })
      .getByRole('link', { name: 'DPD-0417-3021' })
      .click();
    await journey.page.getByRole('heading', { level: 1, name: 'DPD-0417-3021' }).waitFor();
    await expectPlotDrawn();
    await journey.page
      .getByRole('img', { name: /^Light curve of DPD-0417-3021: .* snippet windows shaded/ })
      .waitFor();
    await journey.page.getByRole('table', { name: 'Snippets of this target' }).waitFor();
    await journey.screenshots('lab-target', expectPlotDrawn);

    await journey.page.getByRole('link', { name: 'The campaign' }).click();
    await journey.page.getByRole('heading', { level: 1, name }).waitFor();

    // Settings that fit their ranges but not each other: the server's message lands beside the field.
    journey.expected.push({ path: '/api/campaigns/', status: 400 });
    const upper = journey.page.getByRole('textbox', { name: 'Upper threshold (consensus score)' });
    const lower = journey.page.getByRole('textbox', { name: 'Lower threshold (consensus score)' });
    await upper.fill('0.5');
    await lower.fill('0.5');
    await journey.page.getByRole('button', { name: 'Save settings' }).click();
    await journey.page.getByText('Must be below the upper threshold').waitFor();
    expect(await lower.getAttribute('aria-invalid')).toBe('true');
    await upper.fill('0.9');
    await lower.fill('0.1');
    await journey.page.getByRole('button', { name: 'Save settings' }).click();
    await journey.page.getByRole('status').filter({ hasText: 'Settings saved' }).waitFor();

    // Going live: the campaign's snippets go to the Deck.
    await journey.page.getByRole('button', { name: 'Set live' }).click();
    await journey.page
      .getByRole('status')
      .filter({ hasText: `${name} is live` })
      .waitFor();
    await journey.page.getByRole('button', { name: 'Pause' }).waitFor();
    await journey.page.getByRole('button', { name: 'Close campaign' }).waitFor();
  });

  it('a scientist makes an API token, sees its secret once, and reads the API reference', async () => {
    await journey.signIn('scientist@demo.dipdeck.test');
    await journey.page.goto(journey.url('/lab/tokens'));
    await journey.page.getByRole('heading', { level: 1, name: 'API tokens' }).waitFor();
    await journey.page.getByRole('textbox', { name: 'Name' }).fill('nightly export');
    await journey.page.getByRole('button', { name: 'Create token' }).click();
    await journey.page.getByRole('heading', { name: /Copy the secret of “nightly export” now/ }).waitFor();
    expect((await journey.page.getByTestId('token-secret').textContent())?.length ?? 0).toBeGreaterThan(16);
    await journey.page.getByRole('button', { name: 'I have stored it' }).click();
    expect(await journey.page.getByTestId('token-secret').count()).toBe(0);
    await journey.page.getByRole('table', { name: 'Your API tokens' }).getByText('nightly export').waitFor();
    await journey.screenshots('lab-tokens');

    await journey.page
      .getByRole('navigation', { name: 'Lab sections' })
      .getByRole('link', { name: 'API reference' })
      .click();
    await journey.page.getByRole('heading', { level: 1, name: 'API reference' }).waitFor();
    await journey.page.getByRole('heading', { name: '/api/campaigns/{id}/light-curves' }).waitFor();
    await journey.page.getByText('Authorization: Bearer $DIPDECK_TOKEN').first().waitFor();
    await journey.screenshots('lab-api-reference');
  });

  it('a volunteer who opens a campaign journey.page is told the Lab is not for their role', async () => {
    await journey.signIn('volunteer@demo.dipdeck.test');
    await journey.page.goto(journey.url('/lab/campaigns/1'));
    await journey.page.getByRole('heading', { name: 'The Lab is not for your role' }).waitFor();
  });
});
