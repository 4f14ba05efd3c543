import { sql, type Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createMigrator, migrateToLatest } from '@/db/migrator';
import { publicReportFacts, searchInspections } from '@/db/reports';
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

describe('reports issued before snapshots were kept', () => {
  // A database as it stood before the snapshot migration, with a report issued and sent then.
  let legacy: Awaited<ReturnType<typeof createScratchDb>>;
  const code = 'NP-LEGA-CY23';
  const otherCode = 'NP-LEGA-CY24';
  let jurisdictionId: string;
  let projectId: string;
  let checkId: string;

  beforeAll(async () => {
    legacy = await createScratchDb();
    // The schema just before reports kept their snapshot.
    const before = await createMigrator(legacy.db).migrateTo('2026-12-04T00-00-00_stored-schema-versions');
    expect(before.error).toBeUndefined();
    // The rows a report of that time hangs on, written with that time's columns (today's seed writes today's).
    const db = legacy.db as unknown as Kysely<any>;
    const org = await db.insertInto('organizations').values({ name: 'Legacy Closets (test)' }).returning('id').executeTakeFirstOrThrow();
    const county = await db.insertInto('jurisdictions').values({
      slug: 'legacy-county', name: 'Legacy County (test)', region: 'Test', building_edition: 'IRC 2018', electrical_edition: 'NEC 2017',
      plumbing_edition: 'IPC 2018', plumbing_family: 'IPC', mechanical_edition: 'IRC 2018', fuel_gas_edition: 'IRC 2018',
      inspector_email: 'inspector@legacy.test',
    }).returning('id').executeTakeFirstOrThrow();
    const installer = await db.insertInto('users').values({
      email: 'installer@legacy.test', name: 'Legacy installer', password_hash: 'x', role: 'installer', organization_id: org.id,
    }).returning('id').executeTakeFirstOrThrow();
    const ruleSet = await db.insertInto('rule_sets').values({
      jurisdiction_id: county.id, version: 1, status: 'published', parameters: '{}', schema_version: 0, published_at: new Date(), changelog: 'First version (test)',
    }).returning('id').executeTakeFirstOrThrow();
    const legacyProject = await db.insertInto('projects').values({
      organization_id: org.id, jurisdiction_id: county.id, name: 'Legacy closet', site_address: '1 Old Road', created_by: installer.id,
    }).returning('id').executeTakeFirstOrThrow();
    const revision = await db.insertInto('plan_revisions').values({
      project_id: legacyProject.id, number: 1, plan: '{}', canonical: '{}', schema_version: 0, created_by: installer.id,
    }).returning('id').executeTakeFirstOrThrow();
    const project = { id: legacyProject.id, jurisdiction_id: county.id, created_by: installer.id, revision_id: revision.id, rule_set_id: ruleSet.id };
    projectId = project.id;
    jurisdictionId = project.jurisdiction_id;
    const summary = { pass: 30, fail: 2, caution: 1, needsInfo: 0, notApplicable: 3 };
    checkId = (await legacy.db
      .insertInto('checks')
      .values({ project_id: project.id, plan_revision_id: project.revision_id, rule_set_id: project.rule_set_id, inputs: '{}', facts: '{}', findings: '[]', summary: JSON.stringify(summary), outcome: 'fail', duration_ms: 5, created_by: project.created_by, schema_version: 0 })
      .returning('id')
      .executeTakeFirstOrThrow()).id;
    const report = await legacy.db
      .insertInto('reports')
      .values({ check_id: checkId, code, sha256: 'a'.repeat(64), byte_size: 100, page_count: 3, storage_key: `reports/${project.id}/${code}.pdf`, attachment_ids: '[]', created_by: project.created_by, schema_version: 0 })
      .returning('id')
      .executeTakeFirstOrThrow();
    const jur = await legacy.db.selectFrom('jurisdictions').select('inspector_email').where('id', '=', project.jurisdiction_id).executeTakeFirstOrThrow();
    const send = { project_id: project.id, jurisdiction_id: project.jurisdiction_id, status: 'sent' as const, created_by: project.created_by };
    await legacy.db.insertInto('report_sends').values({ ...send, report_id: report.id, to_email: jur.inspector_email!.toUpperCase() }).execute();
    // A second report of the same check, sent only to some other address.
    const elsewhere = await legacy.db
      .insertInto('reports')
      .values({ check_id: checkId, code: otherCode, sha256: 'c'.repeat(64), byte_size: 100, page_count: 3, storage_key: `reports/${project.id}/${otherCode}.pdf`, attachment_ids: '[]', created_by: project.created_by, schema_version: 0 })
      .returning('id')
      .executeTakeFirstOrThrow();
    await legacy.db.insertInto('report_sends').values({ ...send, report_id: elsewhere.id, to_email: 'someone-else@example.test' }).execute();
    const after = await migrateToLatest(legacy.db);
    expect(after.error).toBeUndefined();
  }, 60_000);
  afterAll(async () => {
    await legacy?.drop();
  });

  it('stay readable: the verification facts and the queue fall back to the current project and say so', async () => {
    await legacy.db.updateTable('projects').set({ name: 'Renamed after issue', permit_number: 'LEG-2026-0007' }).where('id', '=', projectId).execute();
    const facts = await publicReportFacts(legacy.db, code);
    expect(facts).toMatchObject({ code, asIssued: false, projectName: 'Renamed after issue', pageCount: 3, summary: { fail: 2 } });
    const queue = (await searchInspections(legacy.db, { jurisdictionId })).items;
    expect(queue.find((r) => r.code === code)).toMatchObject({ asIssued: false, projectName: 'Renamed after issue', siteAddress: '1 Old Road', permitNumber: 'LEG-2026-0007' });
    // Searching reads the same fallback: today's permit number finds the report that kept no snapshot.
    expect((await searchInspections(legacy.db, { jurisdictionId, q: 'leg-2026-0007' })).items.map((r) => r.code)).toEqual([code]);
    // Sends from before recorded no recipient kind: the inspector's address of today decides, in any case.
    expect(queue.map((r) => r.code)).not.toContain(otherCode);
  });

  it('keep recording whether a send went to the inspector from now on', async () => {
    const report = await legacy.db.selectFrom('reports').select('id').where('code', '=', code).executeTakeFirstOrThrow();
    const row = { report_id: report.id, project_id: projectId, jurisdiction_id: jurisdictionId, to_email: 'x@example.test', status: 'sent' as const };
    await expect(legacy.db.insertInto('report_sends').values(row).execute()).rejects.toThrow(/whether it went to the inspector/);
    await legacy.db.insertInto('report_sends').values({ ...row, to_inspector: false }).execute();
  });

  it('are the only ones without a snapshot: a report inserted now must carry one', async () => {
    const row = { check_id: checkId, sha256: 'b'.repeat(64), byte_size: 100, page_count: 3, storage_key: 'reports/x.pdf', attachment_ids: '[]', schema_version: 1 };
    await expect(legacy.db.insertInto('reports').values({ ...row, code: 'NP-NEWW-ONE2' }).execute()).rejects.toThrow(/snapshot it was issued with/);
    await expect(legacy.db.insertInto('reports').values({ ...row, code: 'NP-NEWW-ONE3', snapshot: '"not an object"' }).execute()).rejects.toThrow(/snapshot/);
    await legacy.db.insertInto('reports').values({ ...row, code: 'NP-NEWW-ONE4', snapshot: JSON.stringify({ schemaVersion: 1 }) }).execute();
  });
});
