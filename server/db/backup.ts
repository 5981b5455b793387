import { execFile } from 'node:child_process';
import { mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import { promisify } from 'node:util';
import sqlite3 from 'sqlite3';
import { isPostgresUrl } from './postgres';

const run = promisify(execFile);

/*
 * Backup and restore of the whole database, while the app runs.
 *
 * SQLite: the online backup API copies a consistent snapshot page by page while the app keeps
 * writing (WAL readers are never blocked); a restore copies a backup back the same way.
 * PostgreSQL: pg_dump takes one consistent snapshot in its own transaction (custom format), and
 * pg_restore puts it back in a single transaction, dropping what is there first.
 */

/** node-sqlite3's backup handle (its typings leave it out). */
interface SqliteBackup {
  step(pages: number, callback: (error: Error | null) => void): void;
  finish(callback?: (error: Error | null) => void): void;
}
type BackupCapable = sqlite3.Database & {
  backup(
    file: string,
    destName: string,
    sourceName: string,
    fileIsDest: boolean,
    callback: (error: Error | null) => void,
  ): SqliteBackup;
};

function openSqlite(path: string, mode: number): Promise<BackupCapable> {
  return new Promise((resolve, reject) => {
    const db = new sqlite3.Database(path, mode, (error) => (error ? reject(error) : resolve(db as BackupCapable)));
  });
}

/** Copies `database`'s main database to `file` (fileIsDest) or `file` into it, in one step. */
async function sqliteCopy(path: string, file: string, fileIsDest: boolean): Promise<void> {
  const mode = fileIsDest ? sqlite3.OPEN_READONLY : sqlite3.OPEN_READWRITE | sqlite3.OPEN_CREATE;
  const db = await openSqlite(path, mode);
  try {
    await new Promise<void>((resolve, reject) => {
      const backup = db.backup(file, 'main', 'main', fileIsDest, (error) => {
        if (error) return reject(error);
        backup.step(-1, (stepError) => {
          if (stepError) return reject(stepError);
          backup.finish((finishError) => (finishError ? reject(finishError) : resolve()));
        });
      });
    });
  } finally {
    await new Promise<void>((resolve) => db.close(() => resolve()));
  }
}

/** Writes a consistent copy of the database `target` (PostgreSQL URL or SQLite path) to `file`. */
export async function backupDatabase(target: string, file: string): Promise<void> {
  mkdirSync(dirname(file), { recursive: true });
  if (isPostgresUrl(target)) {
    await run('pg_dump', ['--format=custom', '--no-owner', `--file=${file}`, `--dbname=${target}`]);
  } else {
    await sqliteCopy(target, file, true);
  }
}

/** Replaces the contents of the database `target` with the backup in `file`. */
export async function restoreDatabase(target: string, file: string): Promise<void> {
  if (isPostgresUrl(target)) {
    await run('pg_restore', [
      '--clean',
      '--if-exists',
      '--no-owner',
      '--exit-on-error',
      '--single-transaction',
      `--dbname=${target}`,
      file,
    ]);
  } else {
    mkdirSync(dirname(target), { recursive: true });
    await sqliteCopy(target, file, false);
  }
}

/** A backup file name with the time in it, under `folder`. */
export function backupFileName(target: string, folder: string, now = new Date()): string {
  const stamp = now.toISOString().replace(/[:.]/g, '-');
  return `${folder}/cardloop-${stamp}.${isPostgresUrl(target) ? 'dump' : 'sqlite'}`;
}
