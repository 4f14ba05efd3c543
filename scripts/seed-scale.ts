// npm run seed:scale: the invented scale scenario (10,000 demo projects) in a throwaway database, for
// `npm run bench` and query-plan checks. Never touches the development database unless pointed there.
import pg from 'pg';
import { createDb } from '@/db/index';
import { migrateToLatest } from '@/db/migrator';
import { defaultScale, hasScaleScenario, SCALE_EMAIL_DOMAIN, writeScaleScenario } from '@/db/scale-seed';
import { seedDemo } from '@/lib/services/demo-seed';
import { demoPassword } from '@/db/demo';
import { hashAtCurrentCost } from '@/lib/platform/auth/password';

const usage = `npm run seed:scale [-- --database <name>] [--projects <n>]
  Without --database: drops and recreates the throwaway database nookpass_scale, migrates it, seeds the demo and the scale scenario.
  With --database <name>: adds the scale scenario to that existing database (migrated and demo-seeded first).`;

function arg(name: string): string | undefined {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? process.argv[i + 1] : undefined;
}

async function main() {
  if (process.argv.includes('--help')) return console.log(usage);
  const adminUrl = process.env.NOOKPASS_ADMIN_DATABASE_URL;
  if (!adminUrl) throw new Error('NOOKPASS_ADMIN_DATABASE_URL is not set (scripts/seed-scale.sh sets it).');
  const explicit = arg('database');
  const name = explicit ?? process.env.NOOKPASS_SCALE_DATABASE ?? 'nookpass_scale';
  if (!/^[a-z0-9_]+$/.test(name)) throw new Error(`--database: '${name}' is not a plain database name (a-z, 0-9, _).`);
  const projects = Number(arg('projects') ?? defaultScale.projects);
  if (!Number.isInteger(projects) || projects < 1 || projects > 100_000) throw new Error('--projects: give a whole number from 1 to 100000.');

  const admin = new pg.Client({ connectionString: adminUrl });
  await admin.connect();
  const exists = (await admin.query('SELECT 1 FROM pg_database WHERE datname = $1', [name])).rowCount === 1;
  if (explicit) {
    if (!exists) throw new Error(`--database: no database '${name}'.`);
  } else {
    // The default database is throwaway: recreated on every run so the figures always start from the same rows.
    await admin.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
    await admin.query(`CREATE DATABASE "${name}"`);
  }
  await admin.end();
  const url = adminUrl.replace(/\/[^/]*$/, `/${name}`);
  const db = createDb(url, 1);
  const t0 = performance.now();
  try {
    const { error } = await migrateToLatest(db);
    if (error) throw error;
    await seedDemo(db);
    if (await hasScaleScenario(db)) throw new Error(`'${name}' already holds the scale scenario; run without --database for a fresh throwaway one.`);
    const result = await writeScaleScenario(db, await hashAtCurrentCost(demoPassword()), { ...defaultScale, projects });
    console.log(`[seed:scale] ${name}: ${JSON.stringify(result.counts)}`);
    console.log(`[seed:scale] timings (ms): ${JSON.stringify(result.timings)}`);
    console.log(`[seed:scale] done in ${((performance.now() - t0) / 1000).toFixed(1)} s; DATABASE_URL=${url}`);
    console.log(`[seed:scale] sign in with the demo password as owner@harbor.${SCALE_EMAIL_DOMAIN} (installer) or inspector@river-city.${SCALE_EMAIL_DOMAIN}`);
  } finally {
    await db.destroy();
  }
}

main().catch((err) => {
  console.error('[seed:scale]', err instanceof Error ? err.message : err);
  process.exit(1);
});
