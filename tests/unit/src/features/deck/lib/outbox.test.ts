import { describe, expect, it } from 'vitest';
import type { Reveal } from '@/features/deck/lib/cards';
import {
  backoffMs,
  classifySendError,
  createOutbox,
  type KeyValueStorage,
  type OutboxEvent,
  type QueuedUndo,
  type QueuedVerdict,
} from '@/features/deck/lib/outbox';
import { ApiError } from '@/lib/api-client';

const reveal: Reveal = { designation: 'DPD-0001-0001', feedback: null };

function memoryStorage(): KeyValueStorage & { data: Map<string, string> } {
  const data = new Map<string, string>();
  return {
    data,
    getItem: (key) => data.get(key) ?? null,
    setItem: (key, value) => void data.set(key, value),
  };
}

/** A hand-driven clock and timer, so backoff can be checked without waiting. */
function fakeTime() {
  let now = 0;
  let pending: { at: number; callback: () => void } | null = null;
  return {
    now: () => now,
    setTimer: (callback: () => void, delayMs: number) => {
      pending = { at: now + delayMs, callback };
      return pending;
    },
    clearTimer: () => {
      pending = null;
    },
    get nextTimerAt() {
      return pending?.at ?? null;
    },
    async advance(ms: number) {
      now += ms;
      const due = pending;
      if (due && due.at <= now) {
        pending = null;
        due.callback();
      }
      await settle();
    },
  };
}

const settle = () => new Promise((resolve) => setTimeout(resolve, 0));

/** A server that stores each clientId once, as the real one does, and can be told to fail. */
function fakeServer() {
  const stored = new Map<string, QueuedVerdict>();
  const undone: string[] = [];
  const calls: string[] = [];
  let failWith: unknown[] = [];
  return {
    stored,
    undone,
    calls,
    failNext(...errors: unknown[]) {
      failWith = errors;
    },
    transport: {
      sendVerdict: async (entry: QueuedVerdict) => {
        calls.push(`POST ${entry.clientId}`);
        const error = failWith.shift();
        if (error === 'stored-then-lost') {
          stored.set(entry.clientId, entry);
          throw new ApiError(0, 'network_error', 'lost');
        }
        if (error) throw error;
        stored.set(entry.clientId, entry);
        return reveal;
      },
      undoVerdict: async (entry: QueuedUndo) => {
        calls.push(`DELETE ${entry.clientId}`);
        const error = failWith.shift();
        if (error) throw error;
        undone.push(entry.clientId);
      },
    },
  };
}

function setup(storage = memoryStorage()) {
  const time = fakeTime();
  const server = fakeServer();
  const events: OutboxEvent[] = [];
  const outbox = createOutbox({
    storage,
    storageKey: 'outbox',
    transport: server.transport,
    classify: classifySendError,
    onEvent: (event) => events.push(event),
    now: time.now,
    random: () => 1,
    setTimer: time.setTimer,
    clearTimer: time.clearTimer,
  });
  return { outbox, server, time, events, storage };
}

const verdict = (clientId: string, snippetId = 1) => ({
  clientId,
  snippetId,
  answer: 'flat' as const,
  markTime: null,
  elapsedMs: 1200,
});

describe('backoffMs', () => {
  it('doubles from one second up to a minute, shortened by at most half at random', () => {
    expect([1, 2, 3, 4, 7, 12].map((attempt) => backoffMs(attempt, () => 1))).toEqual([
      1_000, 2_000, 4_000, 8_000, 60_000, 60_000,
    ]);
    expect(backoffMs(3, () => 0)).toBe(2_000);
  });
});

describe('classifySendError', () => {
  it('retries network trouble, rate limits and server errors; drops refusals', () => {
    expect(classifySendError(new ApiError(0, 'network_error', 'x')).retry).toBe(true);
    expect(classifySendError(new ApiError(503, 'unavailable', 'x')).retry).toBe(true);
    expect(classifySendError(new ApiError(429, 'rate_limited', 'x')).retry).toBe(true);
    for (const [status, code] of [
      [409, 'snippet_not_open'],
      [409, 'campaign_not_live'],
      [409, 'client_id_taken'],
      [403, 'guest_limit'],
      [400, 'validation_failed'],
    ] as const) {
      expect(classifySendError(new ApiError(status, code, 'x')), code).toMatchObject({ retry: false, code });
    }
  });
});

describe('the outbox', () => {
  it('persists a verdict before it is sent, and forgets it once the server has it', async () => {
    const { outbox, server, storage } = setup();
    server.failNext(new ApiError(0, 'network_error', 'offline'));
    outbox.add(verdict('client-0001'));
    expect(JSON.parse(storage.data.get('outbox')!)).toHaveLength(1);
    await settle();
    expect(outbox.waiting()).toBe(1);
    // A new page (a reload, the next visit) finds it and sends it.
    const again = setup(storage);
    again.outbox.start();
    await settle();
    expect(again.server.stored.has('client-0001')).toBe(true);
    expect(JSON.parse(storage.data.get('outbox')!)).toEqual([]);
  });

  it('retries with backoff while the network is down, then sends each verdict once', async () => {
    const { outbox, server, time, events } = setup();
    const offline = new ApiError(0, 'network_error', 'offline');
    server.failNext(offline, offline, offline);
    outbox.add(verdict('client-0001'));
    await settle();
    expect(time.nextTimerAt).toBe(1_000);
    await time.advance(1_000);
    expect(time.nextTimerAt).toBe(3_000);
    await time.advance(2_000);
    expect(time.nextTimerAt).toBe(7_000);
    outbox.add(verdict('client-0002', 2));
    await settle();
    expect(server.calls).toHaveLength(3);
    await time.advance(4_000);
    expect([...server.stored.keys()]).toEqual(['client-0001', 'client-0002']);
    expect(outbox.waiting()).toBe(0);
    expect(
      events
        .filter((event) => event.type === 'retrying')
        .map((event) => event.type === 'retrying' && event.delayMs),
    ).toEqual([1_000, 2_000, 4_000]);
    expect(events.filter((event) => event.type === 'sent')).toHaveLength(2);
  });

  it('back online, sends at once rather than at the backoff time', async () => {
    const { outbox, server, time } = setup();
    server.failNext(new ApiError(0, 'network_error', 'offline'), new ApiError(0, 'network_error', 'offline'));
    outbox.add(verdict('client-0001'));
    await settle();
    await time.advance(1_000);
    expect(time.nextTimerAt).toBe(3_000);
    outbox.retryNow();
    await settle();
    expect(server.stored.has('client-0001')).toBe(true);
  });

  it('drops a verdict the server refuses with 409, tells why, and goes on with the next', async () => {
    const { outbox, server, events } = setup();
    server.failNext(new ApiError(409, 'snippet_not_open', 'This snippet is already settled'));
    outbox.add(verdict('client-0001'));
    outbox.add(verdict('client-0002', 2));
    await settle();
    await settle();
    expect(outbox.waiting()).toBe(0);
    expect([...server.stored.keys()]).toEqual(['client-0002']);
    expect(events).toContainEqual(expect.objectContaining({ type: 'dropped', code: 'snippet_not_open' }));
    expect(server.calls).toEqual(['POST client-0001', 'POST client-0002']);
  });

  it('resends with the same clientId when the answer was lost, so the server stores it once', async () => {
    const { outbox, server, time } = setup();
    server.failNext('stored-then-lost');
    outbox.add(verdict('client-0001'));
    await settle();
    await time.advance(1_000);
    expect(server.calls).toEqual(['POST client-0001', 'POST client-0001']);
    expect(server.stored.size).toBe(1);
    expect(outbox.waiting()).toBe(0);
  });

  it('an undo of a verdict still waiting forgets it; of a sent one, follows it to the server', async () => {
    const { outbox, server } = setup();
    server.failNext(new ApiError(0, 'network_error', 'offline'));
    outbox.add(verdict('client-0001'));
    await settle();
    expect(outbox.undo('client-0001', 1)).toBe('withdrawn');
    expect(outbox.entries()).toEqual([]);

    outbox.add(verdict('client-0002', 2));
    await settle();
    expect(outbox.undo('client-0002', 2)).toBe('queued');
    await settle();
    expect(server.calls).toEqual(['POST client-0001', 'POST client-0002', 'DELETE client-0002']);
    expect(server.undone).toEqual(['client-0002']);
  });

  it('when the undo comes too late, drops it and says so', async () => {
    const { outbox, server, events } = setup();
    outbox.add(verdict('client-0001'));
    await settle();
    server.failNext(new ApiError(409, 'undo_too_late', 'A verdict can only be taken back within 15 seconds'));
    outbox.undo('client-0001', 1);
    await settle();
    expect(events).toContainEqual(expect.objectContaining({ type: 'dropped', code: 'undo_too_late' }));
    expect(outbox.entries()).toEqual([]);
  });

  it('ignores unreadable storage and lists the snippets still waiting', async () => {
    const storage = memoryStorage();
    storage.data.set('outbox', '{not json');
    const { outbox, server } = setup(storage);
    expect(outbox.entries()).toEqual([]);
    server.failNext(new ApiError(502, 'unexpected_response', 'bad gateway'));
    outbox.add(verdict('client-0001', 7));
    await settle();
    expect(outbox.pendingSnippetIds()).toEqual([7]);
  });
});
