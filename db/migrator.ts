import { promises as fs } from 'node:fs';
import path from 'node:path';
import { FileMigrationProvider, Migrator, type MigrationResultSet } from 'kysely';
import type { DB } from '@/db/index';

export const migrationFolder = path.join(process.cwd(), 'migrations');

export function createMigrator(db: DB, folder = migrationFolder): Migrator {
  return new Migrator({ db, provider: new FileMigrationProvider({ fs, path, migrationFolder: folder }) });
}

/** Runs every pending migration; returns Kysely's result set (check `error`). */
export function migrateToLatest(db: DB, folder = migrationFolder): Promise<MigrationResultSet> {
  return createMigrator(db, folder).migrateToLatest();
}
