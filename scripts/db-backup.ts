// npm run db:backup [-- <destination.sqlite>]
// A consistent copy of the SQLite database, taken while the server and workers run: by default
// DATA_DIR/backups/dipdeck-<UTC time>.sqlite. Restore by stopping Dipdeck and putting the copy in
// place of DATA_DIR/dipdeck.sqlite (removing any dipdeck.sqlite-wal and -shm beside it).

import { ConfigError, loadConfig } from '../server/config';
import { BackupRefusedError, backupDatabase, formatBytes } from '../server/db/backup';

const args = process.argv.slice(2);
if (args.length > 1 || args[0]?.startsWith('-')) {
  console.error('usage: npm run db:backup [-- <destination.sqlite>]');
  process.exit(2);
}

try {
  const { source, destination, bytes } = await backupDatabase(loadConfig(), args[0]);
  console.info(`Backed up ${source} to ${destination} (${formatBytes(bytes)}, checked).`);
} catch (error) {
  if (!(error instanceof BackupRefusedError || error instanceof ConfigError)) throw error;
  console.error(error.message);
  process.exitCode = 1;
}
