// `npm start` builds the client only when dist/client is missing or older than its sources.
import { execSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';

const built = 'dist/client/index.html';
const sources = ['src', 'index.html', 'vite.config.ts', 'package-lock.json', 'public'];

function newestMtime(entry) {
  if (!fs.existsSync(entry)) return 0;
  const stat = fs.statSync(entry);
  if (!stat.isDirectory()) return stat.mtimeMs;
  return fs
    .readdirSync(entry)
    .reduce((newest, child) => Math.max(newest, newestMtime(path.join(entry, child))), stat.mtimeMs);
}

const builtAt = fs.existsSync(built) ? fs.statSync(built).mtimeMs : 0;
if (builtAt === 0 || sources.some((source) => newestMtime(source) > builtAt)) {
  console.info('Building the client…');
  execSync('npx vite build', { stdio: 'inherit' });
}
