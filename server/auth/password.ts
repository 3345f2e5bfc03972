import { randomBytes, scrypt, timingSafeEqual } from 'node:crypto';

// scrypt at OWASP ASVS 5.0 requirement 11.4.2 strength: N = 2^17, r = 8, p = 1.
// The parameters travel inside the stored hash, so they can be raised later and old hashes still verify.
export interface ScryptParams {
  log2N: number;
  r: number;
  p: number;
}

export const CURRENT_PARAMS: ScryptParams = { log2N: 17, r: 8, p: 1 };
const KEY_BYTES = 32;
const SALT_BYTES = 16;

// scrypt needs 128·N·r bytes; Node's default maxmem (32 MiB) is too small for N = 2^17.
const maxmemFor = ({ log2N, r }: ScryptParams) => 128 * 2 ** log2N * r + 32 * 1024 * 1024;

function derive(password: string, salt: Buffer, params: ScryptParams): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    scrypt(
      password.normalize('NFKC'),
      salt,
      KEY_BYTES,
      { N: 2 ** params.log2N, r: params.r, p: params.p, maxmem: maxmemFor(params) },
      (error, key) => (error ? reject(error) : resolve(key)),
    );
  });
}

/** Format: `scrypt$<log2 N>$<r>$<p>$<salt base64>$<key base64>`. */
export async function hashPassword(password: string, params: ScryptParams = CURRENT_PARAMS): Promise<string> {
  const salt = randomBytes(SALT_BYTES);
  const key = await derive(password, salt, params);
  return ['scrypt', params.log2N, params.r, params.p, salt.toString('base64'), key.toString('base64')].join(
    '$',
  );
}

function parseHash(stored: string): { params: ScryptParams; salt: Buffer; key: Buffer } | null {
  const parts = stored.split('$');
  if (parts.length !== 6 || parts[0] !== 'scrypt') return null;
  const [log2N, r, p] = parts.slice(1, 4).map(Number) as [number, number, number];
  if (![log2N, r, p].every((n) => Number.isInteger(n) && n > 0) || log2N > 24) return null;
  return {
    params: { log2N, r, p },
    salt: Buffer.from(parts[4] ?? '', 'base64'),
    key: Buffer.from(parts[5] ?? '', 'base64'),
  };
}

export async function verifyPassword(password: string, stored: string): Promise<boolean> {
  const parsed = parseHash(stored);
  if (!parsed || parsed.key.length !== KEY_BYTES) return false;
  const key = await derive(password, parsed.salt, parsed.params);
  return timingSafeEqual(key, parsed.key);
}

export function needsRehash(stored: string): boolean {
  const parsed = parseHash(stored);
  if (!parsed) return true;
  const { log2N, r, p } = parsed.params;
  return log2N < CURRENT_PARAMS.log2N || r < CURRENT_PARAMS.r || p < CURRENT_PARAMS.p;
}

// Verified against when an e-mail is unknown, so that a miss costs the same time as a wrong password.
let decoyHash: Promise<string> | undefined;
export function decoyPasswordHash(): Promise<string> {
  decoyHash ??= hashPassword(randomBytes(16).toString('hex'));
  return decoyHash;
}
