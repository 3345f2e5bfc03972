import { describe, expect, it } from 'vitest';
import { CURRENT_PARAMS, hashPassword, needsRehash, verifyPassword } from '../../../../server/auth/password';

describe('password hashing', () => {
  it('uses at least the OWASP ASVS 5.0 (11.4.2) scrypt parameters: N = 2^17, r = 8, p = 1', () => {
    expect(2 ** CURRENT_PARAMS.log2N).toBeGreaterThanOrEqual(131_072);
    expect(CURRENT_PARAMS.r).toBeGreaterThanOrEqual(8);
    expect(CURRENT_PARAMS.p).toBeGreaterThanOrEqual(1);
  });

  it('stores the parameters and a per-user salt with the hash, and verifies only the right password', async () => {
    const first = await hashPassword('meteor shower at dawn');
    const second = await hashPassword('meteor shower at dawn');
    expect(first).toMatch(/^scrypt\$17\$8\$1\$[A-Za-z0-9+/=]{24}\$[A-Za-z0-9+/=]{44}$/);
    expect(first).not.toBe(second); // different salts
    expect(await verifyPassword('meteor shower at dawn', first)).toBe(true);
    expect(await verifyPassword('meteor shower at dusk', first)).toBe(false);
  });

  it('still verifies a hash made with older, weaker parameters, and asks for a rehash', async () => {
    const weak = await hashPassword('an older passphrase', { log2N: 10, r: 8, p: 1 });
    expect(weak.startsWith('scrypt$10$8$1$')).toBe(true);
    expect(await verifyPassword('an older passphrase', weak)).toBe(true);
    expect(needsRehash(weak)).toBe(true);
    expect(needsRehash(await hashPassword('a current passphrase'))).toBe(false);
  });

  it('answers false, without throwing, for a malformed stored hash', async () => {
    for (const stored of ['', 'plain', 'scrypt$x$8$1$a$b', 'scrypt$30$8$1$AAAA$BBBB', 'bcrypt$2$3$4$5$6']) {
      expect(await verifyPassword('whatever it is', stored)).toBe(false);
    }
  });
});
