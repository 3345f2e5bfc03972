import type { Card } from './cards';

/**
 * The cards waiting on the device. The next card must appear at once after a verdict, and a few verdicts
 * must be possible with no connection, so the queue keeps several cards ahead of the one shown.
 */

/** Cards held beyond the one on screen; below this the queue asks for more. */
export const cardsAhead = 6;
/** The server hands out at most ten at once. */
export const maxCardsPerRequest = 10;
/** The server accepts an `exclude` list of up to 400 characters. */
export const excludeMaxChars = 400;

/** How many cards to ask for now (0: enough are held). */
export function cardsToRequest(heldCount: number): number {
  const ahead = Math.max(0, heldCount - 1);
  if (ahead >= cardsAhead) return 0;
  return Math.min(maxCardsPerRequest, cardsAhead + 2 - ahead);
}

/**
 * Snippets the server must not hand out again: verdicts still on the device first, then the held cards
 * in order, so the last id is the card that will be shown just before the new ones (the server avoids
 * showing one star twice in a row). Oldest ids give way when the list is too long.
 */
export function excludeList(
  pendingSnippetIds: readonly number[],
  heldSnippetIds: readonly number[],
): number[] {
  const held = new Set(heldSnippetIds);
  const ids = [...new Set(pendingSnippetIds.filter((id) => !held.has(id))), ...heldSnippetIds];
  while (ids.length > 0 && ids.join(',').length > excludeMaxChars) ids.shift();
  return ids;
}

/** New cards join the back of the queue; one already held or just judged is dropped. */
export function appendCards(
  held: readonly Card[],
  incoming: readonly Card[],
  judged: ReadonlySet<number>,
): Card[] {
  const seen = new Set(held.map((card) => card.snippetId));
  const next = [...held];
  for (const card of incoming) {
    if (seen.has(card.snippetId) || judged.has(card.snippetId)) continue;
    seen.add(card.snippetId);
    next.push(card);
  }
  return next;
}
