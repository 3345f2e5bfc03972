import { performance } from 'node:perf_hooks';
import { hashPassword } from '../../server/auth/password';
import type { Figure } from './figures';

// What a sign-up or sign-in costs the server: one scrypt at full strength, and how many fit in a
// second when the thread pool runs them side by side.
export async function run(): Promise<Figure[]> {
  const single: number[] = [];
  for (let i = 0; i < 5; i += 1) {
    const start = performance.now();
    await hashPassword('benchmark passphrase');
    single.push(performance.now() - start);
  }
  single.sort((a, b) => a - b);
  const parallel = 8;
  const start = performance.now();
  await Promise.all(Array.from({ length: parallel }, () => hashPassword('benchmark passphrase')));
  const seconds = (performance.now() - start) / 1000;
  return [
    { name: 'auth.scrypt_hash_median', value: single[2]!, unit: 'ms' },
    { name: 'auth.scrypt_hashes_per_s', value: parallel / seconds, unit: 'hashes/s' },
  ];
}
