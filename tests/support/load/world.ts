import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { createCampaign } from '../../../seeds/factories/campaigns';
import { createPerson } from '../../../seeds/factories/people';
import { createSnippetFixtures } from '../../../seeds/factories/snippets';
import type { Role } from '../../../server/auth/roles';
import { loadConfig } from '../../../server/config';
import { createDb, type Db } from '../../../server/db/knex';
import { migrateLatest } from '../../../server/db/migrate';

export interface Account {
  id: number;
  email: string;
  role: Role;
}

/** What a load run starts from: a data directory with a migrated SQLite database, people and a live campaign. */
export interface LoadWorld {
  dataDir: string;
  campaignId: number;
  snippetIds: number[];
  volunteers: Account[];
  scientist: Account;
  moderator: Account;
  /** Everyone's password. */
  password: string;
  /** A connection of the test's own to the server's database (SQLite in WAL mode: it reads beside the server). */
  openDb(): Db;
  remove(): void;
}

const PASSWORD = 'load volunteers keep counting';

/**
 * A campaign of real snippets only, one per invented target, and the people who judge and read it.
 * Real snippets only: without controls no volunteer's reliability moves during the run, so the stored
 * consensus can be recomputed from the verdicts alone and compared exactly.
 */
export async function createLoadWorld(options: {
  name: string;
  volunteers: number;
  snippets: number;
}): Promise<LoadWorld> {
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), `dipdeck-${options.name}-`));
  const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: dataDir, DIPDECK_DEMO: '0' });
  const openDb = () => createDb(config);
  const db = openDb();
  try {
    await migrateLatest(db);
    const campaignId = await createCampaign(db, { name: `Load ${options.name}`, status: 'live' });
    const { snippetIds } = await createSnippetFixtures(db, campaignId, {
      targets: options.snippets,
      real: options.snippets,
    });
    const account = async (role: Role, label: string): Promise<Account> => {
      const email = `${options.name}-${label}@example.com`;
      // One full-strength hash for everyone (reuseHash): each sign-in still checks it as in production.
      const person = await createPerson(db, {
        email,
        displayName: label,
        role,
        password: PASSWORD,
        reuseHash: true,
      });
      return { id: person.id, email, role };
    };
    const volunteers: Account[] = [];
    for (let i = 0; i < options.volunteers; i += 1)
      volunteers.push(await account('volunteer', `volunteer-${i}`));
    return {
      dataDir,
      campaignId,
      snippetIds: snippetIds.real,
      volunteers,
      scientist: await account('scientist', 'scientist'),
      moderator: await account('moderator', 'moderator'),
      password: PASSWORD,
      openDb,
      remove: () => fs.rmSync(dataDir, { recursive: true, force: true }),
    };
  } finally {
    await db.destroy();
  }
}
