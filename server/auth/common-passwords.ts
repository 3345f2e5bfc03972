import fs from 'node:fs';
import path from 'node:path';

// The list and where it comes from: see the header of common-passwords.txt.
let common: Set<string> | undefined;

function load(): Set<string> {
  const text = fs.readFileSync(path.join(import.meta.dirname, 'common-passwords.txt'), 'utf8');
  return new Set(
    text
      .split('\n')
      .map((line) => line.trim())
      .filter((line) => line.length > 0 && !line.startsWith('#')),
  );
}

export function isCommonPassword(password: string): boolean {
  common ??= load();
  return common.has(password.toLowerCase());
}
