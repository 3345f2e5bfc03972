// Preloaded into a real worker process (`node --import tsx --import <this file> worker/index.ts`) by
// the fault tests: just before the Nth SQL statement that matches DIPDECK_TEST_HALT_SQL (a regular
// expression; N is DIPDECK_TEST_HALT_AT, 1 by default) the whole process stops where it stands, inside
// its transaction if it is in one, after printing "HALTED <statement>" on stdout. The test then kills
// it with SIGKILL at exactly that point, which a sleep or a progress event could not promise.
import fs from 'node:fs';
import { createRequire } from 'node:module';

type StatementMethod = (this: { source: string }, ...args: unknown[]) => unknown;

const pattern = process.env.DIPDECK_TEST_HALT_SQL;
if (pattern) {
  const matcher = new RegExp(pattern, 'i');
  const haltAt = Number(process.env.DIPDECK_TEST_HALT_AT ?? '1');
  // The one better-sqlite3 of the process, so the one Statement class Knex's connections use.
  const Database = createRequire(import.meta.url)('better-sqlite3');
  const probe = new Database(':memory:');
  const statement = Object.getPrototypeOf(probe.prepare('select 1')) as Record<string, StatementMethod>;
  probe.close();
  let seen = 0;
  for (const method of ['run', 'all', 'get', 'iterate']) {
    const original = statement[method]!;
    statement[method] = function (this: { source: string }, ...args: unknown[]) {
      if (matcher.test(this.source)) {
        seen += 1;
        if (seen === haltAt) {
          fs.writeSync(1, `HALTED ${this.source.replaceAll(/\s+/g, ' ').slice(0, 120)}\n`);
          // better-sqlite3 is synchronous, so this stops the process before the statement runs.
          Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0);
        }
      }
      return original.apply(this, args);
    };
  }
}
