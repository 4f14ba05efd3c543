import { sql, type Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createMigrator, migrateToLatest } from '@/db/migrator';
import { createScratchDb } from './helpers';

// The migration that records schema versions, run over a database that already holds history:
// rows written before it get version 0, no append-only trigger fires, and history stays frozen.
const BEFORE = '2026-12-03T00-00-00_rate-limits';
const TABLES = ['plan_revisions', 'checks', 'rule_sets', 'reports'] as const;

let scratch: Awaited<ReturnType<typeof createScratchDb>>;
let db: Kysely<any>;
const ids: Record<string, string> = {};

async function one(query: { executeTakeFirstOrThrow(): Promise<unknown> }): Promise<string> {
  return ((await query.executeTakeFirstOrThrow()) as { id: string }).id;
}

beforeAll(async () => {
  scratch = await createScratchDb();
  db = scratch.db as unknown as Kysely<any>;
  const to = await createMigrator(scratch.db).migrateTo(BEFORE);
  expect(to.error).toBeUndefined();

  // History as the app wrote it before versions were recorded.
  const org = await one(db.insertInto('organizations').values({ name: 'Migration Co (invented)' }).returning('id'));
  const jurisdiction = await one(
    db.insertInto('jurisdictions').values({
      slug: 'migration-county', name: 'Migration County (invented)', region: 'Test State', building_edition: 'IRC 2021', electrical_edition: 'NEC 2020',
      plumbing_edition: 'IPC 2021', plumbing_family: 'IPC', mechanical_edition: 'IMC 2021', fuel_gas_edition: 'IFGC 2021',
    }).returning('id'),
  );
  ids.published = await one(db.insertInto('rule_sets').values({ jurisdiction_id: jurisdiction, version: 1, parameters: '{"p":1}' }).returning('id'));
  await db.updateTable('rule_sets').set({ status: 'published', published_at: new Date(), changelog: 'Version 1 (test).' }).where('id', '=', ids.published).execute();
  ids.draft = await one(db.insertInto('rule_sets').values({ jurisdiction_id: jurisdiction, version: 2, parameters: '{"p":2}' }).returning('id'));
  const project = await one(db.insertInto('projects').values({ organization_id: org, jurisdiction_id: jurisdiction, name: 'Old project', site_address: '1 Old Road' }).returning('id'));
  ids.revision = await one(db.insertInto('plan_revisions').values({ project_id: project, number: 1, plan: '{"units":"imperial"}', canonical: '{"units":"imperial"}' }).returning('id'));
  ids.check = await one(
    db.insertInto('checks').values({
      project_id: project, plan_revision_id: ids.revision, rule_set_id: ids.published, inputs: '{"plan":{"units":"imperial"}}', facts: '{}', findings: '[]',
      summary: '{}', outcome: 'pass', duration_ms: 1,
    }).returning('id'),
  );
  ids.report = await one(
    db.insertInto('reports').values({ check_id: ids.check, code: 'OLD-0001', sha256: 'a'.repeat(64), byte_size: 1, page_count: 1, storage_key: 'reports/old.pdf' }).returning('id'),
  );

  const up = await migrateToLatest(scratch.db);
  expect(up.error).toBeUndefined();
});
afterAll(async () => {
  await scratch?.drop();
});

describe('recording schema versions', () => {
  it('gives every row already stored version 0, and leaves the rows otherwise as they were', async () => {
    for (const table of TABLES) {
      const rows = await db.selectFrom(table).select('schema_version').execute();
      expect(rows.length, table).toBeGreaterThan(0);
      expect(rows.map((r) => r.schema_version), table).toEqual(rows.map(() => 0));
    }
    const revision = await db.selectFrom('plan_revisions').select(['plan', 'number']).where('id', '=', ids.revision).executeTakeFirstOrThrow();
    expect(revision).toEqual({ plan: { units: 'imperial' }, number: 1 });
  });

  it('makes every new row state its version: no default, never negative', async () => {
    for (const table of TABLES) {
      const column = await sql<{ is_nullable: string; column_default: string | null }>`
        SELECT is_nullable, column_default FROM information_schema.columns WHERE table_name = ${table} AND column_name = 'schema_version'`.execute(db);
      expect(column.rows, table).toEqual([{ is_nullable: 'NO', column_default: null }]);
    }
    const base = { project_id: (await db.selectFrom('projects').select('id').executeTakeFirstOrThrow()).id, plan: '{}', canonical: '{}' };
    await expect(db.insertInto('plan_revisions').values({ ...base, number: 2 }).execute()).rejects.toThrow(/schema_version/);
    await expect(db.insertInto('plan_revisions').values({ ...base, number: 2, schema_version: -1 }).execute()).rejects.toThrow(/check constraint/);
  });

  it('still refuses to rewrite plan revisions, checks and reports, their version included', async () => {
    for (const [table, id] of [['plan_revisions', ids.revision], ['checks', ids.check], ['reports', ids.report]] as const) {
      await expect(db.updateTable(table).set({ schema_version: 1 }).where('id', '=', id).execute(), table).rejects.toThrow(/append-only/);
      await expect(db.deleteFrom(table).where('id', '=', id).execute(), table).rejects.toThrow(/append-only/);
    }
  });

  it('still refuses to change a published rule set, and retiring it may not change its version', async () => {
    await expect(db.updateTable('rule_sets').set({ schema_version: 1 }).where('id', '=', ids.published).execute()).rejects.toThrow(/cannot be changed/);
    await expect(
      db.updateTable('rule_sets').set({ status: 'retired', retired_at: new Date(), schema_version: 1 }).where('id', '=', ids.published).execute(),
    ).rejects.toThrow(/cannot be changed/);
    await db.updateTable('rule_sets').set({ status: 'retired', retired_at: new Date() }).where('id', '=', ids.published).execute();
    expect(await db.selectFrom('rule_sets').select(['status', 'schema_version']).where('id', '=', ids.published).executeTakeFirstOrThrow()).toEqual({
      status: 'retired',
      schema_version: 0,
    });
    // A draft is still work in progress: saving today's parameters stamps today's version.
    await db.updateTable('rule_sets').set({ parameters: '{"p":3}', schema_version: 1 }).where('id', '=', ids.draft).execute();
  });

  it('migrates down and up again', async () => {
    const migrator = createMigrator(scratch.db);
    // Back to the migration before this one (later migrations come down with it), then up again.
    const down = await migrator.migrateTo('2026-12-03T21-20-00_api-token-expiry');
    expect(down.error).toBeUndefined();
    const columns = await sql`SELECT 1 FROM information_schema.columns WHERE column_name = 'schema_version'`.execute(db);
    expect(columns.rows).toEqual([]);
    const up = await migrateToLatest(scratch.db);
    expect(up.error).toBeUndefined();
  });
});
