import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, type DB } from '@/db/index';
import { migrateToLatest } from '@/db/migrator';
import { searchInspections } from '@/db/reports';
import { findRuleSetById } from '@/db/rule-sets';
import { SCALE_SLUG_PREFIX, writeScaleScenario } from '@/db/scale-seed';
import { evaluate, withoutAdminNotes } from '@/lib/domain/engine';
import { parsePlan } from '@/lib/domain/plan';
import { createScratchDb } from './helpers';

// The scale scenario, small (40 projects in two jurisdictions): the same rows on every run, every check what the engine says, everything marked demo.

const PROJECTS = 40;

async function seeded() {
  const scratch = await createScratchDb();
  const { error } = await migrateToLatest(scratch.db);
  if (error) throw error;
  await sql`INSERT INTO users (email, name, password_hash, role) VALUES ('admin@nookpass.demo', 'Admin (demo)', 'x', 'admin')`.execute(scratch.db);
  // The evaluated results wait in temporary tables: one connection.
  const single = createDb(scratch.url, 1);
  const result = await writeScaleScenario(single, 'not-a-password-hash', { projects: PROJECTS, revisionsPerProject: 3, jurisdictions: 2 });
  await single.destroy();
  return { scratch, result };
}

let a: Awaited<ReturnType<typeof seeded>>;
let b: Awaited<ReturnType<typeof seeded>>;

beforeAll(async () => {
  a = await seeded();
  b = await seeded();
}, 120_000);

afterAll(async () => {
  await a?.scratch.drop();
  await b?.scratch.drop();
});

const snapshotOf = async (db: DB) =>
  (
    await sql<{ row: string }>`
      SELECT concat_ws(' | ', p.id, p.name, p.site_address, p.permit_number, o.name, j.slug, r.number, c.outcome, md5(c.findings::text), rep.code, v.outcome) AS row
      FROM projects p JOIN organizations o ON o.id = p.organization_id JOIN jurisdictions j ON j.id = p.jurisdiction_id
      JOIN plan_revisions r ON r.project_id = p.id JOIN checks c ON c.plan_revision_id = r.id
      LEFT JOIN reports rep ON rep.check_id = c.id LEFT JOIN inspection_reviews v ON v.report_id = rep.id
      ORDER BY p.name, r.number`.execute(db)
  ).rows.map((r) => r.row);

describe('the scale scenario', () => {
  it('has the projects, three revisions and a check of each', () => {
    expect(a.result.counts).toMatchObject({ projects: PROJECTS, planRevisions: PROJECTS * 3, checks: PROJECTS * 3, companies: 8, jurisdictions: 2 });
    expect(a.result.counts.reports).toBeGreaterThan(0);
  });

  it('is the same on every run, ids, report codes and outcomes included', async () => {
    const first = await snapshotOf(a.scratch.db);
    expect(first).toHaveLength(PROJECTS * 3);
    expect(await snapshotOf(b.scratch.db)).toEqual(first);
  });

  it('stores what the engine finds for each revision under the rule set version named', async () => {
    const checks = await a.scratch.db.selectFrom('checks').select(['rule_set_id', 'inputs', 'findings', 'summary']).orderBy('id').limit(12).execute();
    for (const c of checks) {
      const set = (await findRuleSetById(a.scratch.db, c.rule_set_id))!;
      const parsed = parsePlan((c.inputs as { plan: unknown }).plan);
      if (!parsed.ok) throw new Error('a stored plan does not parse');
      const again = withoutAdminNotes(await evaluate({ jurisdiction: set.jurisdictionSlug, version: set.version, parameters: set.parameters, rules: set.rules }, parsed.plan));
      expect(c.summary).toEqual(again.summary);
      expect(c.findings).toEqual(JSON.parse(JSON.stringify(again.findings)));
    }
    // The varied plans give passing and failing checks, not one outcome copied everywhere.
    const all = await sql<{ outcome: string }>`SELECT DISTINCT outcome FROM checks`.execute(a.scratch.db);
    expect(all.rows.map((r) => r.outcome).sort()).toEqual(expect.arrayContaining(['fail', 'pass']));
  });

  it('is marked demo everywhere', async () => {
    const db = a.scratch.db;
    const projects = await db.selectFrom('projects').select(['name', 'site_address', 'is_demo']).execute();
    expect(projects.every((p) => p.is_demo && p.name.startsWith('Demo scale') && p.site_address.endsWith('(invented)'))).toBe(true);
    const orgs = await db.selectFrom('organizations').select(['name', 'is_demo']).execute();
    expect(orgs.every((o) => o.is_demo && o.name.startsWith('Demo'))).toBe(true);
    const people = await db.selectFrom('users').select(['email', 'is_demo']).where('role', '!=', 'admin').execute();
    expect(people.every((u) => u.is_demo && u.email.endsWith('.nookpass.demo'))).toBe(true);
  });

  it("fills an inspector's queue", async () => {
    const jurisdictions = await a.scratch.db.selectFrom('jurisdictions').select('id').where('slug', 'like', `${SCALE_SLUG_PREFIX}%`).execute();
    let listed = 0;
    for (const j of jurisdictions) listed += (await searchInspections(a.scratch.db, { jurisdictionId: j.id })).total;
    expect(listed).toBe(a.result.counts.sends);
  });
});
