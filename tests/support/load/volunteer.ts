import { createHash, randomUUID } from 'node:crypto';
import type { Card } from '../../../src/features/deck/lib/cards';
import { appendCards, cardsToRequest, excludeList } from '../../../src/features/deck/lib/deck-queue';
import type { SignedInSession } from './sign-in';

export type Answer = 'dip' | 'flat' | 'unsure';

/** A verdict as the volunteer sent it, kept until the server answers it for good. */
export interface SentVerdict {
  clientId: string;
  personId: number;
  snippetId: number;
  answer: Answer;
  markTime: number | null;
  elapsedMs: number;
}

/** What the server said to a verdict in the end. */
export interface AnsweredVerdict extends SentVerdict {
  status: number;
  /** The error's code when the server refused it (snippet_not_open, say). */
  code?: string;
  /** How many times it went out (more than 1: an answer was lost and it was sent again, same clientId). */
  attempts: number;
}

/** One HTTP request the load sends, in the form both autocannon and fetch can take. */
export interface PlannedRequest {
  route: string;
  method: 'GET' | 'POST';
  path: string;
  headers: Record<string, string>;
  body?: string;
}

/**
 * Whether a snippet holds a dip, as the volunteers see it: a fixed fifth of the snippets, chosen by id,
 * so that most snippets settle on agreement, some split, and settled dips come early in a short run.
 */
export function looksLikeDip(snippetId: number): boolean {
  return createHash('sha256').update(`dip:${snippetId}`).digest().readUInt8(0) < 51;
}

export function readJson<T>(body: string): T | undefined {
  try {
    return JSON.parse(body) as T;
  } catch {
    return undefined;
  }
}

/** Besides network errors and 5xx, what the web client's outbox sends again; any other refusal is final. */
const RETRIED_STATUSES = new Set([408, 425, 429]);
export const worthRetrying = (status: number) => status >= 500 || RETRIED_STATUSES.has(status);

/**
 * One volunteer on the Deck, driven one request at a time: it holds cards as the web client's queue
 * does (the same cardsToRequest / excludeList / appendCards), judges the card in front, and sends each
 * verdict until it has an answer, again with the same clientId after an answer that never came — as
 * the web client's outbox does (src/features/deck/lib/outbox.ts), without its backoff.
 */
export class VolunteerClient {
  private held: Card[] = [];
  private readonly judged = new Set<number>();
  private pending: { verdict: SentVerdict; attempts: number } | null = null;
  private inFlight: PlannedRequest | null = null;
  private lastRoute: string | null = null;
  private readonly random: () => number;

  constructor(
    readonly session: SignedInSession,
    private readonly campaignId: number,
    private readonly answered: (verdict: AnsweredVerdict) => void,
    seed: number,
  ) {
    let state = seed >>> 0 || 1;
    // xorshift32: each volunteer's answers are reproducible from its seed.
    this.random = () => {
      state ^= state << 13;
      state ^= state >>> 17;
      state ^= state << 5;
      return (state >>> 0) / 2 ** 32;
    };
  }

  private headers(json: boolean): Record<string, string> {
    return {
      cookie: this.session.cookie,
      accept: 'application/json',
      ...(json ? { 'content-type': 'application/json', 'x-csrf-token': this.session.csrfToken } : {}),
    };
  }

  /** The verdict waiting for an answer, if any. */
  waitingVerdict(): SentVerdict | null {
    return this.pending?.verdict ?? null;
  }

  /** The next request to send; a request still in flight has lost its answer (a verdict then goes again). */
  next(): PlannedRequest {
    let request: PlannedRequest;
    if (this.pending) request = this.verdictRequest();
    else if (
      this.held.length === 0 ||
      (cardsToRequest(this.held.length) > 0 && this.lastRoute !== 'deck_next')
    )
      request = this.nextCardsRequest();
    else {
      this.judgeFrontCard();
      request = this.verdictRequest();
    }
    this.inFlight = request;
    this.lastRoute = request.route;
    return request;
  }

  /**
   * The answer to the request last given by next(). An answer that cannot be read (a connection cut
   * mid-answer) counts as no answer: the verdict goes again, which the server's clientId makes harmless.
   */
  answer(status: number, body: string): void {
    const request = this.inFlight;
    this.inFlight = null;
    if (!request || !Number.isInteger(status)) return;
    if (request.route === 'deck_next') {
      const cards = status === 200 ? readJson<{ cards: Card[] }>(body)?.cards : undefined;
      if (cards) this.held = appendCards(this.held, cards, this.judged);
      return;
    }
    const pending = this.pending;
    if (!pending || worthRetrying(status)) return; // sent again on the next turn
    const acknowledged = status === 200 || status === 201;
    if (acknowledged) {
      const verdict = readJson<{ verdict: { clientId: string } }>(body)?.verdict;
      if (verdict?.clientId !== pending.verdict.clientId) return;
    }
    this.pending = null;
    const code = acknowledged ? undefined : readJson<{ error?: { code?: string } }>(body)?.error?.code;
    this.answered({ ...pending.verdict, status, attempts: pending.attempts, ...(code ? { code } : {}) });
  }

  private nextCardsRequest(): PlannedRequest {
    const count = Math.max(1, cardsToRequest(this.held.length));
    const exclude = excludeList(
      [],
      this.held.map((card) => card.snippetId),
    );
    const query = new URLSearchParams({ campaign: String(this.campaignId), count: String(count) });
    if (exclude.length > 0) query.set('exclude', exclude.join(','));
    return {
      route: 'deck_next',
      method: 'GET',
      path: `/api/deck/next?${query}`,
      headers: this.headers(false),
    };
  }

  /** A volunteer who is right 85 % of the time, unsure now and then, and marks the dips they see. */
  private judgeFrontCard(): void {
    const card = this.held.shift()!;
    this.judged.add(card.snippetId);
    const roll = this.random();
    const truth: Answer = looksLikeDip(card.snippetId) ? 'dip' : 'flat';
    const answer: Answer = roll < 0.03 ? 'unsure' : roll < 0.18 ? (truth === 'dip' ? 'flat' : 'dip') : truth;
    const durationDays = card.durationHours / 24;
    const markTime = answer === 'dip' ? card.timeStart + durationDays * (0.45 + 0.1 * this.random()) : null;
    this.pending = {
      verdict: {
        clientId: randomUUID(),
        personId: this.session.account.id,
        snippetId: card.snippetId,
        answer,
        markTime,
        elapsedMs: 800 + Math.floor(this.random() * 4_000),
      },
      attempts: 0,
    };
  }

  private verdictRequest(): PlannedRequest {
    const pending = this.pending!;
    pending.attempts += 1;
    const { clientId, snippetId, answer, markTime, elapsedMs } = pending.verdict;
    return {
      route: 'verdicts',
      method: 'POST',
      path: '/api/verdicts',
      headers: this.headers(true),
      body: JSON.stringify({
        clientId,
        snippetId,
        answer,
        ...(markTime !== null ? { markTime } : {}),
        elapsedMs,
      }),
    };
  }
}
