import fs from 'node:fs';
import path from 'node:path';
import { startAppServer } from '../e2e/support/app-server';
import { launchBrowser } from '../e2e/support/browser';
import { nextCardLatencies, watchNextCardLatency } from '../e2e/support/next-card-latency';
import { type Figure, percentile } from './figures';

// Interaction to Next Paint on the Deck as a mid-range phone would feel it: Chromium at 375 px with its
// CPU slowed 4× (the DevTools "mid-tier mobile" setting), 30 verdicts by keyboard, every interaction's
// duration from the Event Timing API. INP is the worst interaction, or the 98th percentile past 50.
// Also the slowest time from a verdict to the next card on screen (target 50 ms).
const VERDICTS = 30;

export async function run(): Promise<Figure[]> {
  if (!fs.existsSync(path.resolve(import.meta.dirname, '../../dist/client/index.html'))) {
    console.error('# dist/client is missing: run `npm run build` first; deck INP skipped');
    return [];
  }
  const server = await startAppServer();
  const browser = await launchBrowser();
  try {
    const page = await browser.context.newPage();
    const cdp = await browser.context.newCDPSession(page);
    await cdp.send('Emulation.setCPUThrottlingRate', { rate: 4 });
    await page.goto(`${server.baseUrl}/sign-in`);
    await page.getByLabel('E-mail').fill('volunteer@demo.dipdeck.test');
    await page.getByLabel('Password').fill('dipdeck-demo');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('button', { name: 'Sign out' }).waitFor();
    await page.setViewportSize({ width: 375, height: 812 });
    await page.evaluate(() => localStorage.setItem('dipdeck.guide-seen.v1', 'yes'));
    await page.goto(`${server.baseUrl}/deck`);
    const skip = page.getByRole('button', { name: /Skip/ });
    if (await skip.count()) await skip.first().click();
    await page.locator('article[data-snippet-id] .light-curve-plot canvas').waitFor();
    await watchNextCardLatency(page);
    await page.evaluate(() => {
      // One interaction (keydown + keyup) counts once, at its slowest event (the INP definition).
      const byInteraction = new Map<number, number>();
      (window as unknown as { __durations: () => number[] }).__durations = () => [...byInteraction.values()];
      new PerformanceObserver((list) => {
        for (const entry of list.getEntries()) {
          const id = (entry as PerformanceEventTiming).interactionId;
          if (id) byInteraction.set(id, Math.max(byInteraction.get(id) ?? 0, entry.duration));
        }
      }).observe({ type: 'event', durationThreshold: 16, buffered: true } as PerformanceObserverInit);
    });
    const keys = ['ArrowRight', 'ArrowLeft', 'ArrowLeft', 'ArrowUp', 'ArrowLeft'];
    for (let i = 0; i < VERDICTS; i += 1) {
      const before = await page.locator('article[data-snippet-id]').getAttribute('data-snippet-id');
      await page.keyboard.press(keys[i % keys.length]!);
      await page.waitForFunction(
        (previous) =>
          document.querySelector('article[data-snippet-id]')?.getAttribute('data-snippet-id') !== previous,
        before,
        { timeout: 10_000 },
      );
    }
    await page.waitForTimeout(500);
    const durations = (
      await page.evaluate(() => (window as unknown as { __durations: () => number[] }).__durations())
    ).sort((a, b) => a - b);
    const inp =
      durations.length === 0
        ? 0
        : durations.length > 50
          ? percentile(durations, 98)
          : durations[durations.length - 1]!;
    // The Deck records, for each verdict, the time until the next card was on screen.
    const nextCard = await nextCardLatencies(page);
    return [
      { name: 'deck.inp_ms_cpu4x', value: inp, unit: 'ms' },
      {
        name: 'deck.next_card_ms_max_cpu4x',
        value: nextCard.length ? Math.max(...nextCard) : Number.NaN,
        unit: 'ms',
      },
      { name: 'deck.interactions_measured', value: durations.length, unit: '' },
    ];
  } finally {
    await browser.close();
    await server.stop();
  }
}
