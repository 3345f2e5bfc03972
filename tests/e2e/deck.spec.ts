import { describe, expect, it } from 'vitest';
import { setUpBrowserJourney } from './support/journey';
import { nextCardLatencies, watchNextCardLatency } from './support/next-card-latency';

// With the network cut on purpose, Chromium logs every request the outbox and the queue try.
const offlineNoise = /net::ERR_INTERNET_DISCONNECTED/;

const journey = setUpBrowserJourney({
  ignoreErrors: offlineNoise,
  touchSelector: 'button:visible, nav a:visible, [role="slider"]:visible',
  checkSideways: true,
  settleMs: 300,
});

const card = () => journey.page.locator('article[data-snippet-id]');

async function currentSnippet(): Promise<string> {
  await card().waitFor();
  await journey.page.locator('article[data-snippet-id] .light-curve-plot canvas').waitFor();
  return (await card().getAttribute('data-snippet-id')) ?? '';
}

// Hang guards, not speed limits: a loaded CI machine can take seconds to draw a card.
async function nextCardAfter(previous: string) {
  try {
    await journey.page.waitForFunction(
      (before) => {
        const id = document.querySelector('article[data-snippet-id]')?.getAttribute('data-snippet-id');
        return id && id !== before;
      },
      previous,
      { timeout: 30_000 },
    );
  } catch (error) {
    // What the page showed instead, for whoever reads the failure.
    await journey.page.screenshot({ path: 'test-results/deck-next-card-failure.png', fullPage: true });
    const state = await journey.page.evaluate(() => ({
      snippet: document.querySelector('article[data-snippet-id]')?.getAttribute('data-snippet-id'),
      cardsAhead: document.querySelector('[data-cards-ahead]')?.getAttribute('data-cards-ahead'),
      status: [...document.querySelectorAll('[role="status"], [aria-live]')].map((node) => node.textContent),
    }));
    throw new Error(`no next card after ${previous}: ${JSON.stringify(state)}`, { cause: error });
  }
}

async function waitForCardsAhead(count: number) {
  await journey.page.waitForFunction(
    (wanted) =>
      Number(document.querySelector('[data-cards-ahead]')?.getAttribute('data-cards-ahead')) >= wanted,
    count,
    { timeout: 30_000 },
  );
}

async function dragCard(direction: 'right' | 'left' | 'up'): Promise<void> {
  const box = await card().boundingBox();
  if (!box) throw new Error('no card to drag');
  const startX = box.x + box.width / 2;
  const startY = box.y + box.height * 0.4;
  const far = box.width * 0.45;
  const [dx, dy] = direction === 'right' ? [far, 0] : direction === 'left' ? [-far, 0] : [0, -far];
  await journey.page.mouse.move(startX, startY);
  // If the page moved the card meanwhile (a notice above it wrapped), aim again.
  const again = await card().boundingBox();
  if (again && (Math.abs(again.x - box.x) > 1 || Math.abs(again.y - box.y) > 1)) return dragCard(direction);
  await journey.page.mouse.down();
  await journey.page.mouse.move(startX + dx, startY + dy, { steps: 12 });
  await journey.page.mouse.up();
}

async function recordTotal(): Promise<number> {
  return journey.page.evaluate(async () => {
    const response = await fetch('/api/record', { headers: { Accept: 'application/json' } });
    const body = (await response.json()) as { record: { verdicts: { total: number } } };
    return body.record.verdicts.total;
  });
}

describe('the Deck', () => {
  it('a visitor opens the Deck from the home journey.page, reads the guide and judges a card without signing in', async () => {
    await journey.page.goto(journey.url('/'));
    await journey.page.evaluate(() => window.localStorage.clear());
    await journey.page.getByRole('link', { name: 'Try the Deck' }).click();
    await journey.page.getByRole('heading', { level: 1, name: 'Judge snippets' }).waitFor();
    await journey.page.getByRole('heading', { name: 'A planet crossing its star' }).waitFor();
    await journey.screenshots('deck-guide');
    await journey.page.getByRole('button', { name: 'Skip the guide' }).click();

    await journey.page.getByText('You are trying the Deck as a visitor').waitFor();
    const first = await currentSnippet();
    await journey.page.getByRole('button', { name: 'Dip', exact: true }).click();
    await nextCardAfter(first);
    await journey.page.getByText('all verdicts sent').waitFor();
    await journey.page.getByText('Recorded.', { exact: true }).waitFor();
    await journey.page
      .getByText(/1\s+of\s+20/)
      .first()
      .waitFor();
  });

  it('a volunteer judges by keyboard and by dragging, marks a dip, undoes one, and loses nothing offline', async () => {
    await journey.signIn('volunteer@demo.dipdeck.test');
    await journey.page.evaluate(() => window.localStorage.clear());
    await journey.page.goto(journey.url('/deck'));

    // The guide, once: four invented cards, then the Deck remembers it was seen.
    for (const title of ['A planet crossing its star', 'Two stars eclipsing', 'A jump after a gap']) {
      await journey.page.getByRole('heading', { name: title }).waitFor();
      await journey.page.getByRole('button', { name: 'Next example' }).click();
    }
    await journey.page.getByRole('heading', { name: 'A quiet star' }).waitFor();
    await journey.page.getByRole('button', { name: 'Start judging' }).click();
    expect(await journey.page.evaluate(() => window.localStorage.getItem('dipdeck.guide-seen.v1'))).toBe(
      'yes',
    );

    await watchNextCardLatency(journey.page);
    const keys = ['ArrowLeft', 'ArrowRight', 'ArrowUp'] as const;
    let previous = '';
    for (let index = 0; index < 20; index += 1) {
      const id = await currentSnippet();
      if (index === 4) {
        // A tap on the chart sets the mark; the dip verdict carries it.
        const plot = await journey.page.locator('article[data-snippet-id] .u-over').boundingBox();
        if (!plot) throw new Error('no chart');
        await journey.page.mouse.click(plot.x + plot.width * 0.6, plot.y + plot.height / 2);
        await journey.page.getByText(/^mark \d/).waitFor();
        await journey.screenshots('deck-card');
        await journey.page.keyboard.press('ArrowRight');
      } else {
        await journey.page.keyboard.press(keys[index % keys.length]!);
      }
      await nextCardAfter(id);
      previous = id;
    }
    const latency = await nextCardLatencies(journey.page);
    // The time to the next card is measured for every verdict; its target (50 ms) is checked by
    // `npm run bench` (deck.next_card_ms_max), not here, where machine load would make it flaky.
    expect(latency.length).toBeGreaterThanOrEqual(20);
    expect(latency.every((ms) => Number.isFinite(ms) && ms >= 0)).toBe(true);

    // Z takes the last verdict back, and its card comes back to the top.
    await journey.page.keyboard.press('z');
    await journey.page.getByText('Taken back: the card is on top again.').waitFor();
    expect(await currentSnippet()).toBe(previous);

    for (const direction of ['right', 'left', 'up', 'left', 'right'] as const) {
      const id = await currentSnippet();
      await dragCard(direction);
      await nextCardAfter(id);
    }
    // A drag that comes back springs back and records nothing.
    const still = await currentSnippet();
    const box = (await card().boundingBox())!;
    await journey.page.mouse.move(box.x + box.width / 2, box.y + box.height * 0.4);
    await journey.page.mouse.down();
    await journey.page.mouse.move(box.x + box.width * 0.9, box.y + box.height * 0.4, { steps: 8 });
    await journey.page.mouse.move(box.x + box.width / 2, box.y + box.height * 0.4, { steps: 8 });
    await journey.page.waitForTimeout(150);
    await journey.page.mouse.up();
    expect(await currentSnippet()).toBe(still);
    await journey.page.getByText('all verdicts sent').waitFor();

    // Offline: verdicts wait on the device, then arrive once the network is back.
    await waitForCardsAhead(5);
    await journey.browser.context.setOffline(true);
    for (let index = 0; index < 5; index += 1) {
      const id = await currentSnippet();
      await journey.page.keyboard.press('ArrowLeft');
      await nextCardAfter(id);
    }
    await journey.page.getByText('5 verdicts waiting to send').waitFor();
    await journey.browser.context.setOffline(false);
    await journey.page.getByText('all verdicts sent').waitFor({ timeout: 30_000 });
    expect(await recordTotal()).toBe(20 + 5 - 1 + 5);

    await journey.page.goto(journey.url('/record'));
    await journey.page.getByRole('heading', { name: 'Accuracy on controls' }).waitFor();
    await journey.page.getByRole('table', { name: 'Your recent verdicts, newest first' }).waitFor();
    await journey.screenshots('deck-record');
  });
});
