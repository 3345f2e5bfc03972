// npm run admin:create -- <email> "<display name>"   (password from DIPDECK_ADMIN_PASSWORD, or asked for)
// For a real deployment, where DIPDECK_DEMO=0 leaves no accounts: creates the first admin.
import { createInterface } from 'node:readline/promises';
import { isCommonPassword } from '../server/auth/common-passwords';
import { hashPassword } from '../server/auth/password';
import { loadConfig } from '../server/config';
import { createDb } from '../server/db/knex';
import { migrateLatest } from '../server/db/migrate';
import { insertPerson } from '../server/db/people';

const [email, displayName] = process.argv.slice(2);
if (!email || !displayName) {
  console.error('usage: npm run admin:create -- <email> "<display name>"');
  process.exit(2);
}
let password = process.env.DIPDECK_ADMIN_PASSWORD;
if (!password) {
  const prompt = createInterface({ input: process.stdin, output: process.stdout });
  password = await prompt.question('Password (at least 10 characters): ');
  prompt.close();
}
if (password.length < 10 || isCommonPassword(password)) {
  console.error('Choose a password of at least 10 characters that is not a common one.');
  process.exit(1);
}
const db = createDb(loadConfig());
try {
  await migrateLatest(db);
  const person = await insertPerson(db, {
    email,
    displayName,
    role: 'admin',
    passwordHash: await hashPassword(password),
  });
  if (!person) {
    console.error(`An account with ${email} already exists; change its role in the Admin screen instead.`);
    process.exitCode = 1;
  } else {
    console.info(`Admin ${person.email} created (id ${person.id}).`);
  }
} finally {
  await db.destroy();
}
