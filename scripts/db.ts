// npm run db:migrate | db:rollback | db:seed
import { seedDemo } from '../seeds/demo';
import { loadConfig } from '../server/config';
import { createDb } from '../server/db/knex';
import { migrateLatest, rollbackAll } from '../server/db/migrate';
import { countPeople } from '../server/db/people';

const command = process.argv[2];
const config = loadConfig();
const db = createDb(config);

try {
  if (command === 'migrate') {
    const applied = await migrateLatest(db);
    console.info(applied.length ? `applied: ${applied.join(', ')}` : 'already up to date');
  } else if (command === 'rollback') {
    const reverted = await rollbackAll(db);
    console.info(reverted.length ? `reverted: ${reverted.join(', ')}` : 'nothing to revert');
  } else if (command === 'seed') {
    await migrateLatest(db);
    if ((await countPeople(db)) > 0) {
      console.error('The database already holds people; the demo scenario is only planted in an empty one.');
      process.exitCode = 1;
    } else {
      await seedDemo(db, { targets: config.demoTargets });
      console.info('demo scenario seeded');
    }
  } else {
    console.error('usage: tsx scripts/db.ts migrate|rollback|seed');
    process.exitCode = 2;
  }
} finally {
  await db.destroy();
}
