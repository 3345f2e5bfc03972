import type { Answer, Reveal } from './cards';

/**
 * The verdict outbox: every verdict waits on the device until the server has acknowledged it, so a
 * dropped connection, a closed tab or a server hiccup loses nothing. Entries go out one at a time, in the
 * order given (an undo must reach the server after the verdict it takes back). The server is idempotent
 * by clientId, so sending an entry twice, after a reply that never arrived, stores it once.
 */

export interface QueuedVerdict {
  kind: 'verdict';
  clientId: string;
  snippetId: number;
  answer: Answer;
  /** Days, in the light curve's time; only with `dip`. */
  markTime: number | null;
  elapsedMs: number | null;
  queuedAtMs: number;
  attempts: number;
  nextAttemptAtMs: number;
}

export interface QueuedUndo {
  kind: 'undo';
  clientId: string;
  snippetId: number;
  queuedAtMs: number;
  attempts: number;
  nextAttemptAtMs: number;
}

export type OutboxEntry = QueuedVerdict | QueuedUndo;

export interface OutboxTransport {
  sendVerdict: (entry: QueuedVerdict) => Promise<Reveal>;
  undoVerdict: (entry: QueuedUndo) => Promise<void>;
}

/** What a failed send tells the outbox: worth another try later, or final. */
export interface SendFailure {
  retry: boolean;
  code: string;
  message: string;
}

export type OutboxEvent =
  | { type: 'sent'; entry: QueuedVerdict; reveal: Reveal }
  | { type: 'undone'; entry: QueuedUndo }
  | { type: 'dropped'; entry: OutboxEntry; code: string; message: string }
  | { type: 'retrying'; entry: OutboxEntry; delayMs: number }
  | { type: 'changed'; waiting: number };

export interface KeyValueStorage {
  getItem: (key: string) => string | null;
  setItem: (key: string, value: string) => void;
}

export interface OutboxOptions {
  storage: KeyValueStorage | null;
  storageKey: string;
  transport: OutboxTransport;
  /** Decides whether an error is worth retrying; see `classifySendError`. */
  classify: (error: unknown) => SendFailure;
  onEvent: (event: OutboxEvent) => void;
  now?: () => number;
  random?: () => number;
  setTimer?: (callback: () => void, delayMs: number) => unknown;
  clearTimer?: (timer: unknown) => void;
}

export const firstRetryMs = 1_000;
export const longestRetryMs = 60_000;

/**
 * Exponential backoff with jitter: 1 s, 2 s, 4 s … up to a minute, each shortened by up to half at random
 * so that many devices coming back online at once do not all knock together.
 */
export function backoffMs(attempts: number, random: () => number = Math.random): number {
  const base = Math.min(longestRetryMs, firstRetryMs * 2 ** Math.max(0, attempts - 1));
  return Math.round(base * (0.5 + random() / 2));
}

const httpCodesWorthRetrying = new Set([0, 408, 425, 429]);

/**
 * Network trouble and server errors are retried; a refusal (400, 403 guest limit or suspended, 404, 409
 * snippet settled / campaign not live / client id taken) will not change by asking again.
 */
export function classifySendError(error: unknown): SendFailure {
  if (error && typeof error === 'object' && 'status' in error && 'code' in error) {
    const status = Number((error as { status: unknown }).status);
    const code = String((error as { code: unknown }).code);
    const message = error instanceof Error ? error.message : code;
    return { retry: status >= 500 || httpCodesWorthRetrying.has(status), code, message };
  }
  // An answer we could not read: the server may have stored it, and resending is harmless.
  return { retry: true, code: 'unreadable', message: error instanceof Error ? error.message : String(error) };
}

function isEntry(value: unknown): value is OutboxEntry {
  if (!value || typeof value !== 'object') return false;
  const entry = value as Partial<OutboxEntry>;
  return (
    (entry.kind === 'verdict' || entry.kind === 'undo') &&
    typeof entry.clientId === 'string' &&
    typeof entry.snippetId === 'number'
  );
}

export function createOutbox(options: OutboxOptions) {
  const now = options.now ?? Date.now;
  const random = options.random ?? Math.random;
  const setTimer = options.setTimer ?? ((callback, delayMs) => setTimeout(callback, delayMs));
  const clearTimer = options.clearTimer ?? ((timer) => clearTimeout(timer as ReturnType<typeof setTimeout>));

  let entries: OutboxEntry[] = load();
  let inFlight: string | null = null;
  let timer: unknown = null;
  let stopped = false;

  function load(): OutboxEntry[] {
    try {
      const text = options.storage?.getItem(options.storageKey);
      const parsed: unknown = text ? JSON.parse(text) : [];
      return Array.isArray(parsed) ? parsed.filter(isEntry) : [];
    } catch {
      return [];
    }
  }

  function keyOf(entry: OutboxEntry): string {
    return `${entry.kind}:${entry.clientId}`;
  }

  function save() {
    try {
      options.storage?.setItem(options.storageKey, JSON.stringify(entries));
    } catch {
      // Storage full or refused (private mode): the entries still live in memory for this visit.
    }
    options.onEvent({ type: 'changed', waiting: waiting() });
  }

  function waiting(): number {
    return entries.filter((entry) => entry.kind === 'verdict').length;
  }

  function schedule(delayMs: number) {
    if (stopped) return;
    if (timer !== null) clearTimer(timer);
    timer = setTimer(
      () => {
        timer = null;
        void flush();
      },
      Math.max(0, delayMs),
    );
  }

  function remove(entry: OutboxEntry) {
    entries = entries.filter((candidate) => keyOf(candidate) !== keyOf(entry));
    save();
  }

  /** Sends what is due, one entry at a time, until the outbox is empty or the head must wait. */
  async function flush(): Promise<void> {
    while (!stopped && inFlight === null) {
      const head = entries[0];
      if (!head) return;
      const wait = head.nextAttemptAtMs - now();
      if (wait > 0) {
        schedule(wait);
        return;
      }
      inFlight = keyOf(head);
      try {
        if (head.kind === 'verdict') {
          const reveal = await options.transport.sendVerdict(head);
          inFlight = null;
          remove(head);
          options.onEvent({ type: 'sent', entry: head, reveal });
        } else {
          await options.transport.undoVerdict(head);
          inFlight = null;
          remove(head);
          options.onEvent({ type: 'undone', entry: head });
        }
      } catch (error) {
        inFlight = null;
        const failure = options.classify(error);
        if (!failure.retry) {
          remove(head);
          options.onEvent({ type: 'dropped', entry: head, code: failure.code, message: failure.message });
          continue;
        }
        const current = entries.find((entry) => keyOf(entry) === keyOf(head));
        if (!current) continue;
        current.attempts += 1;
        const delayMs = backoffMs(current.attempts, random);
        current.nextAttemptAtMs = now() + delayMs;
        save();
        options.onEvent({ type: 'retrying', entry: current, delayMs });
        schedule(delayMs);
        return;
      }
    }
  }

  return {
    /** Queues a verdict and starts sending it; returns at once, the send happens in the background. */
    add(verdict: Omit<QueuedVerdict, 'kind' | 'queuedAtMs' | 'attempts' | 'nextAttemptAtMs'>) {
      const at = now();
      entries.push({ kind: 'verdict', ...verdict, queuedAtMs: at, attempts: 0, nextAttemptAtMs: at });
      save();
      void flush();
    },
    /**
     * Takes a verdict back. Still waiting and not on its way: it is simply forgotten ('withdrawn'). Sent or
     * being sent: an undo follows it to the server ('queued').
     */
    undo(clientId: string, snippetId: number): 'withdrawn' | 'queued' {
      const waitingEntry = entries.find((entry) => entry.kind === 'verdict' && entry.clientId === clientId);
      if (waitingEntry && inFlight !== keyOf(waitingEntry)) {
        remove(waitingEntry);
        return 'withdrawn';
      }
      const at = now();
      entries.push({ kind: 'undo', clientId, snippetId, queuedAtMs: at, attempts: 0, nextAttemptAtMs: at });
      save();
      void flush();
      return 'queued';
    },
    /** Back online: everything waiting is due now rather than at its backoff time. */
    retryNow() {
      const at = now();
      for (const entry of entries) entry.nextAttemptAtMs = Math.min(entry.nextAttemptAtMs, at);
      if (timer !== null) {
        clearTimer(timer);
        timer = null;
      }
      void flush();
    },
    flush,
    /** Starts sending; whatever a previous visit left waiting is due at once. */
    start() {
      stopped = false;
      const at = now();
      for (const entry of entries) entry.nextAttemptAtMs = Math.min(entry.nextAttemptAtMs, at);
      options.onEvent({ type: 'changed', waiting: waiting() });
      void flush();
    },
    stop() {
      stopped = true;
      if (timer !== null) clearTimer(timer);
      timer = null;
    },
    entries: (): readonly OutboxEntry[] => entries,
    waiting,
    /** Snippets with a verdict still on the device: the server does not know them as judged yet. */
    pendingSnippetIds: (): number[] =>
      entries.filter((entry) => entry.kind === 'verdict').map((entry) => entry.snippetId),
  };
}

export type Outbox = ReturnType<typeof createOutbox>;
