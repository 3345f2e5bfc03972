import type { Page } from 'playwright-core';

// Times, in the page, from each key press to the moment the Deck's card on screen changes: the
// "next card within 50 ms" figure. The browser test checks it is measured; the benchmark reports it.

export async function watchNextCardLatency(page: Page): Promise<void> {
  await page.evaluate(() => {
    const samples: number[] = [];
    (window as unknown as { deckLatency: number[] }).deckLatency = samples;
    let pressedAt: number | null = null;
    window.addEventListener(
      'keydown',
      () => {
        pressedAt = performance.now();
      },
      { capture: true },
    );
    new MutationObserver(() => {
      if (pressedAt === null) return;
      samples.push(performance.now() - pressedAt);
      pressedAt = null;
    }).observe(document.body, { subtree: true, attributes: true, attributeFilter: ['data-snippet-id'] });
  });
}

export async function nextCardLatencies(page: Page): Promise<number[]> {
  return page.evaluate(() => (window as unknown as { deckLatency?: number[] }).deckLatency ?? []);
}
