import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import type { Figure } from './figures';

// The JavaScript a phone downloads to open the Deck: the entry chunk named in index.html and every chunk
// it imports statically, found by reading the built chunks' own import statements (dynamic imports —
// the lazily loaded Lab, Desk, Admin and My record — are left out). Gzip level 9, as a server would send.
const root = path.resolve(import.meta.dirname, '../..');
const clientDir = path.join(root, 'dist/client');

const staticImport = /(?:^|[;\s}])(?:import|export)\s*(?:[\w*${}\s,]*from\s*)?["'](\.{1,2}\/[^"']+\.js)["']/g;

function staticImports(file: string): string[] {
  const code = fs.readFileSync(file, 'utf8');
  const found: string[] = [];
  for (const match of code.matchAll(staticImport)) found.push(path.resolve(path.dirname(file), match[1]!));
  return found;
}

export function deckChunks(dir: string): string[] {
  const html = fs.readFileSync(path.join(dir, 'index.html'), 'utf8');
  const entries = [...html.matchAll(/<script[^>]*type="module"[^>]*src="([^"]+)"/g)].map((match) =>
    path.join(dir, match[1]!.replace(/^\//, '')),
  );
  if (entries.length === 0) throw new Error('dist/client/index.html names no module script');
  const seen = new Set<string>();
  const queue = [...entries];
  while (queue.length > 0) {
    const file = queue.pop()!;
    if (seen.has(file)) continue;
    seen.add(file);
    queue.push(...staticImports(file));
  }
  return [...seen];
}

export async function run(): Promise<Figure[]> {
  if (!fs.existsSync(path.join(clientDir, 'index.html'))) {
    execFileSync(path.join(root, 'node_modules/.bin/vite'), ['build'], { cwd: root, stdio: 'ignore' });
  }
  const bytes = deckChunks(clientDir).reduce(
    (sum, file) => sum + gzipSync(fs.readFileSync(file), { level: 9 }).length,
    0,
  );
  return [{ name: 'client.deck_js_gzip_kb', value: bytes / 1024, unit: 'KB' }];
}
