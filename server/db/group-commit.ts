import type { Knex } from 'knex';
import { AppError } from '../errors';
import type { Db } from './knex';
import { writeTransaction } from './transaction';

/**
 * Writes that arrive together share one transaction ("group commit"). A transaction's fixed cost
 * (BEGIN, COMMIT, the write lock, Knex's bookkeeping) is several times that of a small insert, so
 * under load most of a busy write route's time would go to it; batched, that cost is paid once per
 * batch. A write waits at most for the batch in flight.
 *
 * `work` must raise its expected refusals (AppError) before it writes anything, as a check-then-write
 * function does: a refused item is answered with its error and the rest of the batch goes on. Any
 * other error rolls the batch back and each of its items is tried again in a transaction of its own,
 * so one broken item fails alone.
 */
export interface GroupCommit<I, O> {
  submit(item: I): Promise<O>;
}

interface Pending<I, O> {
  item: I;
  resolve: (value: O) => void;
  reject: (error: unknown) => void;
}

export function createGroupCommit<I, O>(
  db: Db,
  work: (trx: Knex.Transaction, item: I) => Promise<O>,
  options: { maxBatch?: number } = {},
): GroupCommit<I, O> {
  const maxBatch = options.maxBatch ?? 200;
  let queue: Pending<I, O>[] = [];
  let running = false;

  async function runBatch(batch: Pending<I, O>[]): Promise<void> {
    const outcomes: ({ ok: true; value: O } | { ok: false; error: unknown })[] = [];
    try {
      await writeTransaction(db, async (trx) => {
        for (const pending of batch) {
          try {
            outcomes.push({ ok: true, value: await work(trx, pending.item) });
          } catch (error) {
            if (!(error instanceof AppError)) throw error;
            outcomes.push({ ok: false, error });
          }
        }
      });
    } catch {
      // Rolled back: nothing of this batch is stored. Alone, each item meets only its own error.
      for (const pending of batch) {
        await writeTransaction(db, (trx) => work(trx, pending.item)).then(pending.resolve, pending.reject);
      }
      return;
    }
    batch.forEach((pending, index) => {
      const outcome = outcomes[index]!;
      if (outcome.ok) pending.resolve(outcome.value);
      else pending.reject(outcome.error);
    });
  }

  async function drain(): Promise<void> {
    try {
      while (queue.length > 0) {
        const batch = queue.slice(0, maxBatch);
        queue = queue.slice(maxBatch);
        await runBatch(batch);
      }
    } finally {
      running = false;
    }
  }

  return {
    submit(item) {
      return new Promise<O>((resolve, reject) => {
        queue.push({ item, resolve, reject });
        if (!running) {
          running = true;
          // After the I/O callbacks of this turn of the event loop, so that requests that arrived together
          // are in the batch: with SQLite's synchronous driver a request would otherwise run to the end alone.
          setImmediate(() => void drain());
        }
      });
    },
  };
}
