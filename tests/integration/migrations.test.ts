import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createMigrator, migrateToLatest } from '@/db/migrator';
import { createScratchDb } from './helpers';

let scratch: Awaited<ReturnType<typeof createScratchDb>>;
beforeAll(async () => {
  scratch = await createScratchDb();
});
afterAll(async () => {
  await scratch?.drop();
});

async function tables() {
  const rows = await sql<{ table_name: string }>`
    SELECT table_name FROM information_schema.tables WHERE table_schema = 'public' ORDER BY table_name`.execute(scratch.db);
  return rows.rows.map((r) => r.table_name);
}

describe('migrations', () => {
  it('run up from an empty database', async () => {
    expect(await tables()).toEqual([]);
    const { error, results } = await migrateToLatest(scratch.db);
    expect(error).toBeUndefined();
    expect(results?.every((r) => r.status === 'Success')).toBe(true);
    expect(await tables()).toEqual(
      expect.arrayContaining(['organizations', 'users', 'api_tokens', 'jurisdictions', 'audit_log', 'rate_limits']),
    );
    // Sign-in attempts are counted in rate_limits; the e-mail-only lock table is gone.
    expect(await tables()).not.toContain('sign_in_throttle');
  });

  it('are a no-op the second time', async () => {
    const { error, results } = await migrateToLatest(scratch.db);
    expect(error).toBeUndefined();
    expect(results).toEqual([]);
  });

  it('use timestamptz for every timestamp column', async () => {
    const rows = await sql<{ table_name: string; column_name: string; data_type: string }>`
      SELECT table_name, column_name, data_type FROM information_schema.columns
      WHERE table_schema = 'public' AND (data_type LIKE 'timestamp%' OR column_name LIKE '%\_at')`.execute(scratch.db);
    expect(rows.rows.length).toBeGreaterThan(5);
    for (const r of rows.rows.filter((r) => !r.table_name.startsWith('kysely_'))) {
      expect(`${r.table_name}.${r.column_name}: ${r.data_type}`).toMatch(/timestamp with time zone$/);
    }
  });

  it('enforce unique e-mails, role values and installer organizations in the database', async () => {
    const org = await scratch.db.insertInto('organizations').values({ name: 'Scratch Co' }).returning('id').executeTakeFirstOrThrow();
    const base = { name: 'A', password_hash: 'x', role: 'installer' as const, organization_id: org.id };
    await scratch.db.insertInto('users').values({ ...base, email: 'a@example.test' }).execute();
    await expect(scratch.db.insertInto('users').values({ ...base, email: 'a@example.test' }).execute()).rejects.toThrow(/unique/i);
    await expect(
      scratch.db.insertInto('users').values({ ...base, email: 'b@example.test', role: 'superuser' as never }).execute(),
    ).rejects.toThrow(/check/i);
    await expect(
      scratch.db.insertInto('users').values({ ...base, email: 'c@example.test', organization_id: null }).execute(),
    ).rejects.toThrow(/users_installer_has_organization/);
    await expect(scratch.db.insertInto('users').values({ ...base, email: 'MiXed@example.test' }).execute()).rejects.toThrow(/check/i);
  });

  it('keep the audit log append-only', async () => {
    await scratch.db.insertInto('audit_log').values({ actor_user_id: null, action: 'test', entity_type: 'x', details: '{}' }).execute();
    await expect(scratch.db.updateTable('audit_log').set({ action: 'rewritten' }).execute()).rejects.toThrow(/append-only/);
    await expect(scratch.db.deleteFrom('audit_log').execute()).rejects.toThrow(/append-only/);
    await expect(sql`TRUNCATE audit_log`.execute(scratch.db)).rejects.toThrow(/append-only/);
  });

  it('migrate all the way down and up again', async () => {
    const migrator = createMigrator(scratch.db);
    await scratch.db.deleteFrom('users').execute();
    await scratch.db.deleteFrom('organizations').execute();
    let step = await migrator.migrateDown();
    while (!step.error && step.results && step.results.length > 0) step = await migrator.migrateDown();
    expect(step.error).toBeUndefined();
    expect((await tables()).filter((t) => !t.startsWith('kysely_'))).toEqual([]);
    const up = await migrateToLatest(scratch.db);
    expect(up.error).toBeUndefined();
  });
});
