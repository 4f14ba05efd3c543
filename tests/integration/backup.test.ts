import { execFile } from 'node:child_process';
import { mkdtempSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { sql } from 'kysely';
import { afterAll, describe, expect, it } from 'vitest';
import { migrateToLatest } from '@/db/migrator';
import { seedDemo } from '@/lib/services/demo-seed';
import { createScratchDb } from './helpers';

const run = promisify(execFile);
const scratches: Awaited<ReturnType<typeof createScratchDb>>[] = [];
afterAll(async () => {
  for (const s of scratches) await s.drop();
});

async function snapshot(db: Awaited<ReturnType<typeof createScratchDb>>['db']) {
  const tables = await sql<{ table_name: string }>`
    SELECT table_name FROM information_schema.tables WHERE table_schema = 'public' ORDER BY table_name`.execute(db);
  const out: Record<string, unknown[]> = {};
  for (const { table_name } of tables.rows) out[table_name] = (await sql.raw(`SELECT * FROM "${table_name}" ORDER BY 1`).execute(db)).rows;
  return out;
}

describe('npm run db:backup and db:restore', () => {
  it('round-trip every table, and the restored copy still refuses to rewrite history', async () => {
    const source = await createScratchDb();
    const target = await createScratchDb();
    scratches.push(source, target);
    const { error } = await migrateToLatest(source.db);
    expect(error).toBeUndefined();
    await seedDemo(source.db);
    await source.db.insertInto('audit_log').values({ actor_user_id: null, action: "it'; DROP TABLE users; --", entity_type: 'test', details: '{"x": "<b>"}' }).execute();

    const file = path.join(mkdtempSync(path.join(tmpdir(), 'np-backup-')), 'backup.dump');
    await run('bash', ['scripts/db-backup.sh', file], { env: { ...process.env, DATABASE_URL: source.url } });
    expect(statSync(file).size).toBeGreaterThan(10_000);
    await run('bash', ['scripts/db-restore.sh', file], { env: { ...process.env, DATABASE_URL: target.url } });

    const [a, b] = await Promise.all([snapshot(source.db), snapshot(target.db)]);
    expect(Object.keys(b)).toEqual(Object.keys(a));
    expect(b).toEqual(a);
    expect((a.audit_log as { action: string }[]).some((r) => r.action === "it'; DROP TABLE users; --")).toBe(true);
    await expect(target.db.deleteFrom('audit_log').execute()).rejects.toThrow(/append-only/);
    await expect(target.db.updateTable('rules').set({ title: 'x' }).execute()).rejects.toThrow(/cannot be changed/);

    // Restoring over a database that has data is refused, and leaves it as it was.
    const again = await run('bash', ['scripts/db-restore.sh', file], { env: { ...process.env, DATABASE_URL: target.url } }).catch((e) => e);
    expect(again.code).not.toBe(0);
    expect(String(again.stderr)).toMatch(/already has \d+ tables/);
    expect(await snapshot(target.db)).toEqual(b);
  });
});
