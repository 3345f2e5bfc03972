import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../server/db/knex';
import { setUpBrowserJourney } from './support/journey';

const journey = setUpBrowserJourney({ checkSideways: true, settleMs: 300 });

// The demo at the journeys' small target count may have no split snippet at all; three snippets with
// verdicts are sent to the Desk here, as the consensus does when the most verdicts leave one undecided.
let madeSplit: number[] = [];

beforeAll(async () => {
  const db = createDb({
    databaseUrl: undefined,
    sqliteFile: path.join(journey.server.dataDir, 'dipdeck.sqlite'),
  });
  try {
    const rows: { id: number }[] = await db('snippets')
      .where({ kind: 'real' })
      .whereIn('state', ['open', 'settled'])
      .where('verdict_count', '>', 0)
      .orderByRaw("case when state = 'open' then 0 else 1 end")
      .orderBy([{ column: 'verdict_count', order: 'desc' }, 'id'])
      .limit(3)
      .select('id');
    madeSplit = rows.map((row) => Number(row.id));
    expect(madeSplit, 'three real snippets with verdicts in the demo').toHaveLength(3);
    await db('snippets').whereIn('id', madeSplit).update({
      state: 'split',
      split_reason: 'max_verdicts',
      outcome: null,
      settled_at: new Date().toISOString(),
    });
  } finally {
    await db.destroy();
  }
});

const reviewHeading = () => journey.page.getByRole('heading', { level: 1 });
const announcement = () => journey.page.locator('[data-desk-announcement]');

async function shownSnippet(): Promise<number> {
  const review = journey.page.locator('[data-review-snippet-id]');
  await review.waitFor();
  await journey.page.locator('.light-curve-plot canvas').first().waitFor();
  return Number(await review.getAttribute('data-review-snippet-id'));
}

interface ReviewState {
  snippet: { state: string; outcome: string | null };
  rulings: { ruling: string; note: string | null }[];
}

async function reviewFromApi(snippetId: number): Promise<ReviewState> {
  return journey.page.evaluate(async (id) => {
    const response = await fetch(`/api/desk/splits/${id}`, { headers: { Accept: 'application/json' } });
    return ((await response.json()) as { review: ReviewState }).review;
  }, snippetId);
}

describe('the Desk', () => {
  it('a moderator rules three split snippets by keyboard, each going on to the next, then reads the audit log', async () => {
    await journey.signIn('moderator@demo.dipdeck.test');
    await journey.page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link', { name: 'Desk', exact: true })
      .click();
    await journey.page.getByRole('heading', { level: 1, name: 'Split snippets' }).waitFor();
    const queue = journey.page.getByRole('table', { name: /^Split snippets/ });
    await queue.waitFor();
    for (const id of madeSplit) {
      expect(await queue.getByRole('link', { name: new RegExp(`^Review snippet ${id} of`) }).count()).toBe(1);
    }
    await journey.screenshots('desk-queue');

    await journey.page.getByRole('link', { name: 'Start with the first' }).click();
    const ruled: { id: number; ruling: string; designation: string }[] = [];
    const keys = [
      { key: 'd', ruling: 'dip' },
      { key: 'f', ruling: 'flat' },
      { key: 's', ruling: 'systematic' },
    ] as const;

    for (const [index, { key, ruling }] of keys.entries()) {
      const id = await shownSnippet();
      const designation = (await reviewHeading().textContent())?.trim() ?? '';
      if (index === 0) await journey.screenshots('desk-review');
      if (index === 1) {
        // N goes to the note; letters typed there never rule; Esc gives the keys back.
        await journey.page.keyboard.press('n');
        await journey.page.keyboard.type('faint, doubtful shape');
        expect(await journey.page.getByRole('textbox', { name: /Note/ }).inputValue()).toBe(
          'faint, doubtful shape',
        );
        expect(await shownSnippet()).toBe(id);
        await journey.page.keyboard.press('Escape');
      }
      await journey.page.keyboard.press(key);
      await announcement()
        .getByText(`Ruled ${ruling} on ${designation} (snippet #${id})`, { exact: false })
        .waitFor();
      await journey.page.waitForFunction(
        (before) =>
          document.querySelector('[data-review-snippet-id]')?.getAttribute('data-review-snippet-id') !==
          String(before),
        id,
      );
      ruled.push({ id, ruling, designation });
    }

    for (const { id, ruling } of ruled) {
      const review = await reviewFromApi(id);
      expect(review.snippet.state, `state of snippet ${id}`).toBe('ruled');
      expect(review.snippet.outcome).toBe(ruling === 'dip' ? 'dip' : 'flat');
      expect(review.rulings.at(-1)?.ruling).toBe(ruling);
    }
    expect((await reviewFromApi(ruled[1]!.id)).rulings.at(-1)?.note).toBe('faint, doubtful shape');

    const sections = journey.page.getByRole('navigation', { name: 'Desk sections' });
    await sections.getByRole('link', { name: 'Volunteers', exact: true }).click();
    await journey.page.getByRole('heading', { level: 1, name: 'Volunteers' }).waitFor();
    await journey.page.getByRole('table', { name: /^Volunteers, sorted by/ }).waitFor();
    await journey.screenshots('desk-volunteers');
    // At desktop width the whole table fits: no column hides behind a sideways scroll.
    const overflow = await journey.page
      .getByRole('table', { name: /^Volunteers, sorted by/ })
      .evaluate((table) => table.parentElement!.scrollWidth - table.parentElement!.clientWidth);
    expect(overflow, 'pixels of the volunteer table beyond its box at 1440 px').toBeLessThanOrEqual(1);

    // One volunteer of the demo crowd: warned, suspended after confirming, and restored.
    await journey.page.getByRole('searchbox', { name: 'Search volunteers' }).fill('crowd-01@');
    const name = await journey.page.evaluate(async () => {
      const response = await fetch('/api/desk/volunteers?search=crowd-01%40', {
        headers: { Accept: 'application/json' },
      });
      return (
        ((await response.json()) as { volunteers: { displayName: string }[] }).volunteers[0]?.displayName ??
        ''
      );
    });
    await expect.poll(() => journey.page.locator('tbody tr').count()).toBe(1);
    await journey.page.getByText('crowd-01@demo.dipdeck.test').waitFor();
    expect(name).not.toBe('');

    await journey.page.getByRole('button', { name: `Record a warning for ${name}` }).click();
    await journey.page
      .getByRole('textbox', { name: 'Warning' })
      .fill('Please look at the whole snippet before answering.');
    await journey.page.getByRole('button', { name: 'Record warning' }).click();
    // Recorded on the audit log and e-mailed through the mail queue (the embedded mail catcher keeps it).
    await journey.page.getByText(`Warning recorded and e-mailed to ${name}.`).waitFor();

    await journey.page.getByRole('button', { name: `Suspend ${name}` }).click();
    await journey.page.getByRole('textbox', { name: 'Reason' }).fill('Answers without looking');
    await journey.page.getByRole('button', { name: 'Suspend…' }).click();
    await journey.page.getByText(`Suspend ${name}?`).waitFor();
    await journey.screenshots('desk-volunteer-suspend');
    await journey.page.getByRole('button', { name: `Yes, suspend ${name}` }).click();
    await journey.page.getByText(new RegExp(`^${name} is suspended\\.`)).waitFor();
    await journey.page.getByRole('button', { name: `Restore ${name}` }).click();
    await journey.page
      .getByRole('region', { name: `Restore ${name}` })
      .getByRole('button', { name: `Restore ${name}` })
      .click();
    await journey.page.getByText(new RegExp(`^${name} is restored\\.`)).waitFor();

    await sections.getByRole('link', { name: 'Audit log', exact: true }).click();
    await journey.page.getByRole('heading', { level: 1, name: 'Audit log' }).waitFor();
    const log = journey.page.getByRole('table', { name: 'Audit log entries, newest first' });
    await log.waitFor();
    for (const action of ['volunteer.warned', 'volunteer.suspended', 'volunteer.restored']) {
      expect(await log.getByRole('row').filter({ hasText: action }).count(), action).toBe(1);
    }
    await journey.screenshots('desk-audit');

    // The filter asks the server for one action only: the three rulings, each with its snippet.
    await journey.page.getByRole('textbox', { name: 'Action' }).fill('snippet.ruled');
    await journey.page.getByRole('button', { name: 'Apply filters' }).click();
    await journey.page.getByText(/^1–3\s+of\s+3\s+entries$/).waitFor();
    expect(new URL(journey.page.url()).searchParams.get('action')).toBe('snippet.ruled');
    expect(await log.getByRole('row').filter({ hasText: 'volunteer.' }).count()).toBe(0);
    for (const { id } of ruled) {
      expect(
        await log
          .getByRole('row')
          .filter({ hasText: new RegExp(`snippet #${id}(?!\\d)`) })
          .count(),
        `entry of ${id}`,
      ).toBe(1);
    }
  });

  it('a volunteer who goes to the Desk is told it is not for their role', async () => {
    await journey.signIn('volunteer@demo.dipdeck.test');
    const asked: string[] = [];
    journey.page.on('request', (request) => {
      if (request.url().includes('/api/desk/')) asked.push(request.url());
    });
    await journey.page.goto(journey.url('/desk/volunteers'));
    await journey.page.getByRole('heading', { name: 'The Desk is not for your role' }).waitFor();
    expect(asked, 'the guard asks the API for nothing of the Desk').toEqual([]);
  });
});
