import { Kysely, PostgresDialect, sql, type CompiledQuery } from 'kysely';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { listLatestChecksInJurisdiction } from '@/db/checks';
import { migrateToLatest } from '@/db/migrator';
import { listPeople } from '@/db/people';
import { listProjects } from '@/db/projects';
import { searchInspections } from '@/db/reports';
import type { Database } from '@/db/types';
import { projectListQuerySchema } from '@/lib/domain/projects/schema';
import type { AppUser } from '@/lib/domain/roles';
import { createScratchDb } from './helpers';

/*
 * Every query behind a list page, as the repositories send it, is explained on a database large enough for the
 * planner to prefer indexes where they help: 40 jurisdictions (an inspector's queue is a small part of all reports),
 * 20 companies, 24,000 projects with two revisions and two checks each, a report sent for every other project.
 * A sequential scan over one of the big tables means the page reads every row as the data grows.
 */

const BIG_TABLES = ['projects', 'plan_revisions', 'checks', 'reports', 'report_sends', 'inspection_reviews', 'users'];
const PROJECTS = 24_000;

let scratch: Awaited<ReturnType<typeof createScratchDb>>;
let pool: pg.Pool;
let traced: Kysely<Database>;
const captured: CompiledQuery[] = [];
let installer: AppUser;
let inspectorJurisdictionId: string;
const admin = { id: '00000000-0000-4000-8000-000000000001', role: 'admin', organizationId: null, jurisdictionId: null } as unknown as AppUser;

beforeAll(async () => {
  scratch = await createScratchDb();
  const { error } = await migrateToLatest(scratch.db);
  if (error) throw error;
  const db = scratch.db;
  await sql`INSERT INTO organizations (name) SELECT 'Plan test company ' || i FROM generate_series(1, 20) i`.execute(db);
  await sql`INSERT INTO jurisdictions (slug, name, region, building_edition, electrical_edition, plumbing_edition, plumbing_family, mechanical_edition, fuel_gas_edition, inspector_email)
    SELECT 'plan-test-' || i, 'Plan test county ' || i, 'Test', 'IRC 2021', 'NEC 2023', 'IPC 2021', 'IPC', 'IMC 2021', 'IFGC 2021', 'permits' || i || '@plan-test.invalid'
    FROM generate_series(1, 40) i`.execute(db);
  await sql`INSERT INTO rule_sets (jurisdiction_id, version, parameters, schema_version) SELECT id, 1, '{}', 1 FROM jurisdictions`.execute(db);
  await sql`CREATE TEMPORARY TABLE o AS SELECT id, row_number() OVER (ORDER BY name) - 1 AS n FROM organizations`.execute(db);
  await sql`CREATE TEMPORARY TABLE j AS SELECT j.id, s.id AS rule_set_id, j.inspector_email, row_number() OVER (ORDER BY j.slug) - 1 AS n FROM jurisdictions j JOIN rule_sets s ON s.jurisdiction_id = j.id`.execute(db);
  // People: installers of every company, an inspector per jurisdiction, and more installers for the people list.
  await sql`INSERT INTO users (email, name, password_hash, role, organization_id)
    SELECT 'installer' || i || '@plan-test.invalid', 'Installer ' || md5(i::text), 'x', 'installer', (SELECT id FROM o WHERE n = i % 20)
    FROM generate_series(1, 6000) i`.execute(db);
  await sql`INSERT INTO users (email, name, password_hash, role, jurisdiction_id)
    SELECT 'inspector' || n || '@plan-test.invalid', 'Inspector ' || n, 'x', 'inspector', id FROM j`.execute(db);
  await sql`INSERT INTO projects (organization_id, jurisdiction_id, name, site_address, permit_number, created_at, updated_at, archived_at)
    SELECT (SELECT id FROM o WHERE n = i % 20), (SELECT id FROM j WHERE n = (i / 7) % 40),
      'Closet ' || i || ' ' || substr(md5(i::text), 1, 8), (i % 9000) || ' ' || (ARRAY['Example','Sample','Placeholder','Fictional'])[i % 4 + 1] || ' Lane',
      CASE WHEN i % 3 = 0 THEN NULL ELSE 'P-' || lpad(i::text, 6, '0') END,
      now() - (i || ' minutes')::interval, now() - ((i * 7919) % ${PROJECTS} || ' minutes')::interval,
      CASE WHEN i % 25 = 0 THEN now() ELSE NULL END
    FROM generate_series(1, ${PROJECTS}) i`.execute(db);
  await sql`INSERT INTO plan_revisions (project_id, number, plan, canonical, schema_version, created_at)
    SELECT p.id, n, '{"units":"imperial"}', '{"units":"imperial"}', 1, p.created_at + (n || ' hours')::interval FROM projects p, generate_series(1, 2) n`.execute(db);
  await sql`INSERT INTO checks (project_id, plan_revision_id, rule_set_id, inputs, facts, findings, summary, schema_version, outcome, duration_ms, created_at)
    SELECT r.project_id, r.id, j.rule_set_id, '{"plan":{"units":"imperial"},"canonical":{"units":"imperial"},"planSchemaVersion":1}', '{}', '[]', '{"pass":1,"fail":0,"caution":0,"needsInfo":0,"notApplicable":0}', 1,
      CASE WHEN r.number = 1 THEN 'fail' ELSE 'pass' END, 1, r.created_at + interval '1 minute'
    FROM plan_revisions r JOIN projects p ON p.id = r.project_id JOIN j ON j.id = p.jurisdiction_id`.execute(db);
  await sql`INSERT INTO reports (check_id, code, sha256, byte_size, page_count, storage_key, schema_version, snapshot, created_at)
    SELECT c.id, 'NP-' || upper(substr(md5(c.id::text), 1, 4)) || '-' || upper(substr(md5(c.id::text), 5, 4)) || '-' || upper(substr(md5(c.id::text), 9, 4)) || '-' || upper(substr(md5(c.id::text), 13, 4)),
      encode(sha256(c.id::text::bytea), 'hex'), 1000, 4, 'plan-test/' || c.id, 1,
      jsonb_build_object('schemaVersion', 1,
        'project', jsonb_build_object('name', p.name, 'siteAddress', p.site_address, 'permitNumber', p.permit_number, 'isDemo', false),
        'jurisdiction', jsonb_build_object('slug', 'plan-test', 'name', 'Plan test county'),
        'company', jsonb_build_object('name', 'Plan test company', 'licenseNumber', NULL),
        'ruleSet', jsonb_build_object('version', 1),
        'check', jsonb_build_object('checkedAt', to_char(c.created_at AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"'), 'summary', c.summary, 'outcome', c.outcome)),
      c.created_at + interval '1 minute'
    FROM checks c JOIN plan_revisions r ON r.id = c.plan_revision_id JOIN projects p ON p.id = c.project_id
    WHERE r.number = 2 AND (hashtext(p.id::text) & 1) = 0`.execute(db);
  await sql`INSERT INTO report_sends (report_id, project_id, jurisdiction_id, to_email, status, to_inspector, created_at)
    SELECT r.id, c.project_id, p.jurisdiction_id, j.inspector_email, 'sent', true, r.created_at + interval '1 minute'
    FROM reports r JOIN checks c ON c.id = r.check_id JOIN projects p ON p.id = c.project_id JOIN j ON j.id = p.jurisdiction_id`.execute(db);
  await sql`INSERT INTO inspection_reviews (report_id, outcome, finding_comments, created_at)
    SELECT report_id, CASE WHEN (hashtext(report_id::text) & 2) = 0 THEN 'approved' ELSE 'corrections-needed' END, '{}', created_at + interval '1 day'
    FROM report_sends WHERE (hashtext(report_id::text) & 1) = 0`.execute(db);
  // Autovacuum keeps a settled database's statistics and visibility map current; a fresh one needs it by hand.
  await sql`VACUUM ANALYZE`.execute(db);

  const org = await sql<{ id: string }>`SELECT id FROM o WHERE n = 3`.execute(db);
  installer = { id: '00000000-0000-4000-8000-000000000002', role: 'installer', organizationId: org.rows[0].id, jurisdictionId: null } as unknown as AppUser;
  inspectorJurisdictionId = (await sql<{ id: string }>`SELECT id FROM j WHERE n = 5`.execute(db)).rows[0].id;
  pool = new pg.Pool({ connectionString: scratch.url, max: 2 });
  traced = new Kysely<Database>({
    dialect: new PostgresDialect({ pool }),
    log: (event) => {
      if (event.level === 'query') captured.push(event.query);
    },
  });
}, 120_000);

afterAll(async () => {
  await traced?.destroy();
  await scratch?.drop();
});

type PlanNode = { 'Node Type': string; 'Relation Name'?: string; 'Index Name'?: string; Plans?: PlanNode[] };

function nodes(plan: PlanNode): PlanNode[] {
  return [plan, ...(plan.Plans ?? []).flatMap(nodes)];
}

/** Runs a list the way the app does, then explains every query it sent; returns what each one scans. */
async function plansOf(run: (db: Kysely<Database>) => Promise<unknown>) {
  captured.length = 0;
  await run(traced);
  expect(captured.length).toBeGreaterThan(0);
  const out: Array<{ sql: string; seqScans: string[]; indexes: string[] }> = [];
  for (const q of captured) {
    const result = await pool.query(`EXPLAIN (FORMAT JSON) ${q.sql}`, q.parameters as unknown[]);
    const all = nodes(result.rows[0]['QUERY PLAN'][0].Plan);
    out.push({
      sql: q.sql.slice(0, 80),
      seqScans: all.filter((n) => n['Node Type'] === 'Seq Scan' && BIG_TABLES.includes(n['Relation Name'] ?? '')).map((n) => n['Relation Name']!),
      indexes: all.filter((n) => n['Index Name']).map((n) => n['Index Name']!),
    });
  }
  return out;
}

async function expectIndexed(run: (db: Kysely<Database>) => Promise<unknown>) {
  for (const plan of await plansOf(run)) {
    expect(plan, plan.sql).toMatchObject({ seqScans: [] });
    expect(plan.indexes.length, plan.sql).toBeGreaterThan(0);
  }
}

const projects = (user: () => AppUser, query: Record<string, string>) => (db: Kysely<Database>) => listProjects(db, user(), projectListQuerySchema.parse(query));

describe('list queries use indexes at scale', () => {
  it('the seeded data is large enough to matter', async () => {
    const counts = await sql<{ projects: number; reports: number; sends: number }>`
      SELECT (SELECT count(*) FROM projects)::int AS projects, (SELECT count(*) FROM reports)::int AS reports, (SELECT count(*) FROM report_sends)::int AS sends`.execute(scratch.db);
    expect(counts.rows[0].projects).toBe(PROJECTS);
    expect(counts.rows[0].reports).toBeGreaterThan(PROJECTS / 3);
    // A list that falls back to reading everything shows up as a sequential scan here (the check can fail).
    const everything = await plansOf((db) => db.selectFrom('projects').select('id').where('notes', '=', 'x').execute());
    expect(everything[0].seqScans).toEqual(['projects']);
  });

  describe("an installer's projects list", () => {
    for (const sort of ['updated', 'name', 'jurisdiction', 'created']) {
      for (const dir of ['asc', 'desc']) {
        it(`sorted by ${sort} ${dir}`, () => expectIndexed(projects(() => installer, { sort, dir })));
      }
    }
    it('a later page', () => expectIndexed(projects(() => installer, { page: '12' })));
    it('archived ones', () => expectIndexed(projects(() => installer, { archived: '1' })));
    it('a search by name, address or permit', () => expectIndexed(projects(() => installer, { q: '01234' })));
    it('a search by jurisdiction name', () => expectIndexed(projects(() => installer, { q: 'county 7' })));
  });

  describe("an administrator's projects list (every company)", () => {
    for (const sort of ['updated', 'name', 'created']) {
      it(`sorted by ${sort}`, () => expectIndexed(projects(() => admin, { sort })));
    }
    it('a search', () => expectIndexed(projects(() => admin, { q: 'P-0123' })));
    it('a search by jurisdiction name', () => expectIndexed(projects(() => admin, { q: 'county 12' })));
  });

  describe("an inspector's inspections list", () => {
    const queue = (extra: Parameters<typeof searchInspections>[1] extends infer S ? Partial<S> : never) => (db: Kysely<Database>) =>
      searchInspections(db, { jurisdictionId: inspectorJurisdictionId, ...extra });
    it('first page', () => expectIndexed(queue({})));
    it('a later page', () => expectIndexed(queue({ page: 3 })));
    it('a search', () => expectIndexed(queue({ q: 'Sample' })));
    it('awaiting an outcome', () => expectIndexed(queue({ outcome: 'awaiting' })));
    it('approved', () => expectIndexed(queue({ outcome: 'approved' })));
    it('corrections needed, within dates', () => expectIndexed(queue({ outcome: 'corrections-needed', from: '2020-01-01', to: '2099-12-31' })));
  });

  it("the impact run's projects of one jurisdiction with their latest checks", () =>
    expectIndexed((db) => listLatestChecksInJurisdiction(db, inspectorJurisdictionId)));

  describe("the administrators' people list", () => {
    it('everyone', () => expectIndexed((db) => listPeople(db, {})));
    it('by role', () => expectIndexed((db) => listPeople(db, { role: 'inspector' })));
    it('a search by name or e-mail', () => expectIndexed((db) => listPeople(db, { search: 'installer1234@' })));
    it('a search by company', () => expectIndexed((db) => listPeople(db, { search: 'company 17' })));
  });
});
