// npm run db:seed: puts the invented demo scenario into DATABASE_URL (local use and tests only).
import { createDb } from '@/db/index';
import { seedDemo } from '@/lib/services/demo-seed';

async function main() {
  if (process.env.NOOKPASS_DEMO !== '1') {
    console.error('[seed] refusing to seed: the demo data is for local use and tests (set NOOKPASS_DEMO=1).');
    process.exit(1);
  }
  const url = process.env.DATABASE_URL;
  if (!url) {
    console.error('[seed] DATABASE_URL is not set.');
    process.exit(1);
  }
  const db = createDb(url, 1);
  try {
    await seedDemo(db);
    console.log('[seed] demo scenario is in place');
  } finally {
    await db.destroy();
  }
}

main().catch((err) => {
  console.error('[seed]', err);
  process.exit(1);
});
