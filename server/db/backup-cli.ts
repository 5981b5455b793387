import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import { databaseLabel, databaseTarget, loadConfig } from '../config';
import { backupDatabase, backupFileName, restoreDatabase } from './backup';

// `npm run backup [FILE]` writes a consistent copy while the app runs (default: backups/cardloop-<time>);
// `npm run restore FILE` puts one back. Stop every app node before a restore.
const [command, file] = process.argv.slice(2);
const config = loadConfig();
const target = databaseTarget(config, process.cwd());

if (command === 'backup') {
  if (!config.DATABASE_URL && !existsSync(target)) {
    console.error(
      `No database at ${target}: set DATABASE_PATH (or DATABASE_URL) as the app is started with, then run the backup again.`,
    );
    process.exit(1);
  }
  const out = resolve(file ?? backupFileName(target, 'backups'));
  await backupDatabase(target, out);
  console.log(`Backed up ${databaseLabel(config)} to ${out}`);
} else if (command === 'restore' && file) {
  if (!existsSync(file)) {
    console.error(`No backup file ${file}.`);
    process.exit(1);
  }
  await restoreDatabase(target, resolve(file));
  console.log(`Restored ${databaseLabel(config)} from ${file}. Start the app again.`);
} else {
  console.error('Usage: npm run backup [FILE]  |  npm run restore FILE');
  process.exit(1);
}
