import { createDb } from '@/db/index';
import { migrateToLatest } from '@/db/migrator';

async function main() {
  const url = process.env.DATABASE_URL;
  if (!url) {
    console.error('[migrate] DATABASE_URL is not set.');
    process.exit(1);
  }
  const db = createDb(url, 1);
  const { error, results } = await migrateToLatest(db);
  for (const r of results ?? []) {
    const mark = r.status === 'Success' ? 'applied' : r.status === 'Error' ? 'FAILED ' : 'skipped';
    console.log(`[migrate] ${mark} ${r.migrationName}`);
  }
  await db.destroy();
  if (error) {
    console.error('[migrate] migration failed:', error instanceof Error ? error.message : error);
    process.exit(1);
  }
  if (!results?.length) console.log('[migrate] database is up to date');
}

main().catch((err) => {
  console.error('[migrate]', err);
  process.exit(1);
});
