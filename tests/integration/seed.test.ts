import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { migrateToLatest } from '@/db/migrator';
import { seedDemo } from '@/lib/services/demo-seed';
import { createScratchDb } from './helpers';

let scratch: Awaited<ReturnType<typeof createScratchDb>>;
beforeAll(async () => {
  scratch = await createScratchDb();
  const { error } = await migrateToLatest(scratch.db);
  if (error) throw error;
});
afterAll(async () => {
  await scratch?.drop();
});

async function snapshot() {
  const out: Record<string, unknown[]> = {};
  const tables = await sql<{ table_name: string }>`
    SELECT table_name FROM information_schema.tables
    WHERE table_schema = 'public' AND table_name NOT LIKE 'kysely_%' ORDER BY table_name`.execute(scratch.db);
  for (const { table_name } of tables.rows) {
    const rows = await sql.raw(`SELECT * FROM "${table_name}" ORDER BY 1`).execute(scratch.db);
    out[table_name] = rows.rows;
  }
  return out;
}

describe('demo seed', () => {
  it('creates the demo scenario', async () => {
    await seedDemo(scratch.db);
    const users = await scratch.db.selectFrom('users').select(['email', 'role']).orderBy('email').execute();
    expect(users.map((u) => u.email)).toEqual([
      'admin@nookpass.demo',
      'inspector@nookpass.demo',
      'installer2@nookpass.demo',
      'installer@nookpass.demo',
      'other-installer@nookpass.demo',
    ]);
    const orgs = await scratch.db.selectFrom('organizations').select('name').execute();
    expect(orgs).toHaveLength(2);
    const jur = await scratch.db.selectFrom('jurisdictions').selectAll().orderBy('slug').execute();
    expect(jur.map((j) => [j.slug, j.building_edition, j.electrical_edition, j.plumbing_family])).toEqual([
      ['demo-city', 'IRC 2021', 'NEC 2023', 'UPC'],
      ['demo-county', 'IRC 2018', 'NEC 2017', 'IPC'],
    ]);
    expect(jur.every((j) => j.is_demo)).toBe(true);
    expect(jur.map((j) => [j.slug, j.time_zone])).toEqual([
      ['demo-city', 'America/Chicago'],
      ['demo-county', 'America/Denver'],
    ]);
  });

  it('gives demo jurisdictions seeded before zones were stored their zone, and leaves one an admin chose', async () => {
    // As the migration left them: UTC for rows that existed before the column.
    await scratch.db.updateTable('jurisdictions').set({ time_zone: 'UTC' }).where('slug', '=', 'demo-county').execute();
    await scratch.db.updateTable('jurisdictions').set({ time_zone: 'America/Boise' }).where('slug', '=', 'demo-city').execute();
    await seedDemo(scratch.db);
    const jur = await scratch.db.selectFrom('jurisdictions').select(['slug', 'time_zone']).orderBy('slug').execute();
    expect(jur.map((j) => [j.slug, j.time_zone])).toEqual([
      ['demo-city', 'America/Boise'],
      ['demo-county', 'America/Denver'],
    ]);
    await scratch.db.updateTable('jurisdictions').set({ time_zone: 'America/Chicago' }).where('slug', '=', 'demo-city').execute();
  });

  it('gives the demo company an invented appliance catalog marked demo, and the other company none', async () => {
    const models = await scratch.db
      .selectFrom('appliance_models as m')
      .innerJoin('organizations as o', 'o.id', 'm.organization_id')
      .select(['o.name', 'm.kind', 'm.label', 'm.is_demo'])
      .execute();
    expect(new Set(models.map((m) => m.name))).toEqual(new Set(['Demo Closet Works']));
    expect(models.map((m) => m.kind).sort()).toEqual(['dryer', 'dryer', 'dryer', 'dryer', 'dryer', 'washer', 'washer', 'washer', 'washer-dryer']);
    expect(models.every((m) => m.is_demo && m.label.startsWith('Demo ') && m.label.endsWith('(demo)'))).toBe(true);
  });

  it('leaves exactly the same rows when run twice', async () => {
    const before = await snapshot();
    await seedDemo(scratch.db);
    const after = await snapshot();
    expect(after).toEqual(before);
  });
});
