import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { createPerson } from '../../../../../seeds/factories/people';
import * as password from '../../../../../server/auth/password';
import type { Db } from '../../../../../server/db/knex';
import { checkCredentials, INVALID_CREDENTIALS } from '../../../../../server/services/auth/check-credentials';
import { testDatabases } from '../../../../support/databases';

vi.mock('../../../../../server/auth/password', async (importOriginal) => {
  const actual = await importOriginal<typeof password>();
  return { ...actual, verifyPassword: vi.fn(actual.verifyPassword) };
});

// Timing: an unknown address must cost what a known one costs, one full-strength scrypt. The test
// checks that the same work is done (timings are too noisy to assert); `npm run bench -- auth`
// measures the two side by side.
describe('checkCredentials', () => {
  let db: Db;
  let drop: () => Promise<void>;
  beforeAll(async () => {
    ({ db, drop } = await testDatabases[0]!.open());
  });
  afterAll(() => drop());

  it('verifies a password against a hash for an unknown address too, and refuses both the same way', {
    timeout: 30_000,
  }, async () => {
    const person = await createPerson(db, { password: 'the right passphrase' });
    const verify = vi.mocked(password.verifyPassword);
    verify.mockClear();

    const wrong = await checkCredentials(db, person.email!, 'a wrong passphrase').catch((error) => error);
    const unknown = await checkCredentials(db, 'unknown@example.com', 'a wrong passphrase').catch(
      (error) => error,
    );

    expect(verify).toHaveBeenCalledTimes(2);
    const [, knownHash] = verify.mock.calls[0]!;
    const [, decoyHash] = verify.mock.calls[1]!;
    expect(decoyHash).toBe(await password.decoyPasswordHash());
    // The decoy is a hash of the same kind and strength as a real one.
    expect(decoyHash.split('$').slice(0, -2)).toEqual(knownHash.split('$').slice(0, -2));
    for (const error of [wrong, unknown]) {
      expect(error).toMatchObject({ code: 'invalid_credentials', message: INVALID_CREDENTIALS });
    }
  });
});
