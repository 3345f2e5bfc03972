import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

/** SESSION_SECRET if set; otherwise a secret generated once and kept (owner-only) in the data directory. */
export function resolveSessionSecret(configured: string | undefined, dataDir: string): string {
  if (configured) return configured;
  const file = path.join(dataDir, 'session-secret');
  try {
    return fs.readFileSync(file, 'utf8').trim();
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'ENOENT') throw error;
  }
  fs.mkdirSync(dataDir, { recursive: true });
  const secret = randomBytes(48).toString('base64url');
  try {
    fs.writeFileSync(file, secret, { mode: 0o600, flag: 'wx' });
    return secret;
  } catch (error) {
    // Another process (a worker started at the same time) wrote it first: use theirs.
    if ((error as NodeJS.ErrnoException).code === 'EEXIST') return fs.readFileSync(file, 'utf8').trim();
    throw error;
  }
}
