import { createHash, randomBytes } from 'node:crypto';

// API tokens carry 256 random bits, so a fast hash is enough to store them: nobody can guess one, and a
// database leak does not reveal them. The prefix makes them recognisable (and findable by secret scanners).
export const TOKEN_PREFIX = 'ddk_';

export function generateApiToken(): { secret: string; hash: string; displayPrefix: string } {
  const secret = `${TOKEN_PREFIX}${randomBytes(32).toString('base64url')}`;
  return { secret, hash: hashApiToken(secret), displayPrefix: secret.slice(0, 10) };
}

export const hashApiToken = (secret: string): string => createHash('sha256').update(secret).digest('hex');
