import { createHmac, timingSafeEqual } from 'node:crypto';

// The token in every newsletter's unsubscribe link: the person's id and an HMAC of it under a key
// derived from the session secret, so a link works without signing in and cannot be made for
// someone else. It does not expire: an unsubscribe link must keep working (RFC 8058 §3).

const keyOf = (secret: string) => createHmac('sha256', secret).update('dipdeck unsubscribe v1').digest();
const macOf = (secret: string, personId: number) =>
  createHmac('sha256', keyOf(secret)).update(`unsubscribe:${personId}`).digest('base64url');

export function signUnsubscribeToken(secret: string, personId: number): string {
  return `${personId}.${macOf(secret, personId)}`;
}

/** The person the token was made for, or null when it was not made with this secret. */
export function verifyUnsubscribeToken(secret: string, token: string): number | null {
  const match = /^([1-9]\d{0,9})\.([A-Za-z0-9_-]{43})$/.exec(token);
  if (!match) return null;
  const personId = Number(match[1]);
  const expected = Buffer.from(macOf(secret, personId));
  const given = Buffer.from(match[2]!);
  return expected.length === given.length && timingSafeEqual(expected, given) ? personId : null;
}
