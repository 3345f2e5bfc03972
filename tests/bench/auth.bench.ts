import { performance } from 'node:perf_hooks';
import { createPerson } from '../../seeds/factories/people';
import { hashPassword } from '../../server/auth/password';
import { checkCredentials } from '../../server/services/auth/check-credentials';
import { testDatabases } from '../support/databases';
import type { Figure } from './figures';

const median = (values: number[]): number =>
  [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)]!;

async function timed(work: () => Promise<unknown>): Promise<number> {
  const start = performance.now();
  await work().catch(() => {});
  return performance.now() - start;
}

// What a sign-up or sign-in costs the server: one scrypt at full strength, and how many fit in a
// second when the thread pool runs them side by side. And whether a refused sign-in takes as long
// for an unknown address as for a wrong password (a ratio near 1: timing tells nothing).
export async function run(): Promise<Figure[]> {
  const single: number[] = [];
  for (let i = 0; i < 5; i += 1) single.push(await timed(() => hashPassword('benchmark passphrase')));
  const parallel = 8;
  const start = performance.now();
  await Promise.all(Array.from({ length: parallel }, () => hashPassword('benchmark passphrase')));
  const seconds = (performance.now() - start) / 1000;

  const { db, drop } = await testDatabases[0]!.open();
  const person = await createPerson(db, { password: 'the right passphrase' });
  const wrongPassword: number[] = [];
  const unknownAddress: number[] = [];
  await checkCredentials(db, 'warm-up@example.com', 'x').catch(() => {});
  for (let i = 0; i < 7; i += 1) {
    wrongPassword.push(await timed(() => checkCredentials(db, person.email!, 'a wrong passphrase')));
    unknownAddress.push(
      await timed(() => checkCredentials(db, `nobody${i}@example.com`, 'a wrong passphrase')),
    );
  }
  await drop();
  return [
    { name: 'auth.scrypt_hash_median', value: median(single), unit: 'ms' },
    { name: 'auth.scrypt_hashes_per_s', value: parallel / seconds, unit: 'hashes/s' },
    { name: 'auth.refused_sign_in_wrong_password_ms', value: median(wrongPassword), unit: 'ms' },
    { name: 'auth.refused_sign_in_unknown_address_ms', value: median(unknownAddress), unit: 'ms' },
    {
      name: 'auth.refused_sign_in_unknown_vs_wrong_ratio',
      value: median(unknownAddress) / median(wrongPassword),
      unit: '',
    },
  ];
}
