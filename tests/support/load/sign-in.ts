import type { Account } from './world';

/** A signed-in browser, as far as the API can tell: its session cookie and the CSRF token of that session. */
export interface SignedInSession {
  account: Account;
  cookie: string;
  csrfToken: string;
}

export interface SignInReport {
  sessions: SignedInSession[];
  /** Sign-ins the server refused with 429 (each was tried again after a pause). */
  rateLimited: number;
  elapsedMs: number;
}

const SESSION_COOKIE = /^(?:__Host-)?dipdeck\.sid=[^;]+/;

function sessionCookie(response: Response, fallback: string | null): string {
  for (const header of response.headers.getSetCookie()) {
    const match = SESSION_COOKIE.exec(header);
    if (match) return match[0];
  }
  if (fallback) return fallback;
  throw new Error(`no session cookie in the answer to ${response.url} (HTTP ${response.status})`);
}

async function csrfToken(baseUrl: string, cookie: string | null): Promise<{ token: string; cookie: string }> {
  const response = await fetch(`${baseUrl}/api/auth/csrf`, { headers: cookie ? { cookie } : {} });
  if (response.status !== 200) throw new Error(`GET /api/auth/csrf answered ${response.status}`);
  const { token } = (await response.json()) as { token: string };
  return { token, cookie: sessionCookie(response, cookie) };
}

/**
 * Signs one person in the way the web client does: a CSRF token for the visitor's session, the sign-in
 * (which makes a new session), then the new session's own token.
 */
async function signIn(
  baseUrl: string,
  account: Account,
  password: string,
  onRateLimited: () => void,
): Promise<SignedInSession> {
  for (let attempt = 1; ; attempt += 1) {
    const visitor = await csrfToken(baseUrl, null);
    const response = await fetch(`${baseUrl}/api/auth/sign-in`, {
      method: 'POST',
      headers: { cookie: visitor.cookie, 'x-csrf-token': visitor.token, 'content-type': 'application/json' },
      body: JSON.stringify({ email: account.email, password }),
    });
    if (response.status === 429 && attempt < 5) {
      onRateLimited();
      await response.arrayBuffer();
      await new Promise((resolve) => setTimeout(resolve, 1_000 * attempt));
      continue;
    }
    if (response.status !== 200) {
      throw new Error(`signing in ${account.email} answered ${response.status}: ${await response.text()}`);
    }
    const signedIn = await csrfToken(baseUrl, sessionCookie(response, null));
    return { account, cookie: signedIn.cookie, csrfToken: signedIn.token };
  }
}

/** Signs everyone in through POST /api/auth/sign-in, a few at a time (each costs the server one scrypt). */
export async function signInAll(
  baseUrl: string,
  accounts: Account[],
  password: string,
  parallel = 6,
): Promise<SignInReport> {
  const started = Date.now();
  const sessions: SignedInSession[] = new Array(accounts.length);
  let rateLimited = 0;
  let next = 0;
  const lanes = Array.from({ length: Math.min(parallel, accounts.length) }, async () => {
    while (next < accounts.length) {
      const index = next;
      next += 1;
      sessions[index] = await signIn(baseUrl, accounts[index]!, password, () => {
        rateLimited += 1;
      });
    }
  });
  await Promise.all(lanes);
  return { sessions, rateLimited, elapsedMs: Date.now() - started };
}
