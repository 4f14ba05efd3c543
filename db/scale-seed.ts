import { createHash } from 'node:crypto';
import { sql } from 'kysely';
import type { DB } from '@/db/index';
import { demoPlans } from '@/db/demo-plans';
import { createPublishedVersion, findRuleSetById, type RuleSetWithRules } from '@/db/rule-sets';
import { outcomeOf } from '@/lib/domain/checks/outcome';
import { CHECK_SCHEMA_VERSION } from '@/lib/domain/checks/stored';
import { evaluate, withoutAdminNotes, type EvaluationSummary } from '@/lib/domain/engine';
import { parsePlan, type PlanInput } from '@/lib/domain/plan';
import { PLAN_SCHEMA_VERSION } from '@/lib/domain/plan/upgrade';
import { newReportCode } from '@/lib/domain/reports/code';
import { buildReportSnapshot } from '@/lib/domain/reports/snapshot';
import { REPORT_SCHEMA_VERSION } from '@/lib/domain/reports/stored';
import { buildRuleSet } from '@/rules';

/*
 * An invented scenario at scale, for benchmarks and query-plan checks: demo companies with thousands of
 * projects in demo jurisdictions, each project with plan revisions (the demo plans with varied sizes and
 * exhaust lengths), a stored check of every revision, and reports sent to the inspectors, some with an
 * outcome. Every check is computed by the engine; equal plans under the same rule set version share one
 * evaluation. Deterministic: a fixed seed and a fixed date give the same names, plans and outcomes each run.
 */

/** `jurisdictions` (1 to 6) takes the first ones of the list; fewer means fewer rule set versions to evaluate under. */
export type ScaleOptions = { projects: number; revisionsPerProject: number; jurisdictions?: number };
export const defaultScale: ScaleOptions = { projects: 10_000, revisionsPerProject: 3, jurisdictions: 6 };

/** Slugs of the scale jurisdictions start with this; the bench and the seed's own refusal look for it. */
export const SCALE_SLUG_PREFIX = 'demo-scale-';
/** Every scale person's e-mail ends with this. */
export const SCALE_EMAIL_DOMAIN = 'scale.nookpass.demo';

// Fixed, so two runs give the same rows (ids included).
const SEED = 0x5eed_15;
const ANCHOR = Date.parse('2026-11-30T12:00:00Z');
const DAY = 86_400_000;
const BATCH = 2_000;

/** A small seeded generator (mulberry32): enough spread for invented data, and repeatable. */
function random(seed: number) {
  let a = seed >>> 0;
  const next = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return {
    next,
    int: (n: number) => Math.floor(next() * n),
    pick: <T>(xs: readonly T[]): T => xs[Math.floor(next() * xs.length)],
    weighted: (weights: readonly number[]) => {
      const total = weights.reduce((s, w) => s + w, 0);
      let r = next() * total;
      for (let i = 0; i < weights.length; i++) if ((r -= weights[i]) < 0) return i;
      return weights.length - 1;
    },
    bytes: (n: number) => Buffer.from(Array.from({ length: n }, () => Math.floor(next() * 256))),
    uuid: () => {
      const b = Array.from({ length: 16 }, () => Math.floor(next() * 256));
      b[6] = (b[6] & 0x0f) | 0x40;
      b[8] = (b[8] & 0x3f) | 0x80;
      const h = b.map((x) => x.toString(16).padStart(2, '0')).join('');
      return `${h.slice(0, 8)}-${h.slice(8, 12)}-${h.slice(12, 16)}-${h.slice(16, 20)}-${h.slice(20)}`;
    },
  };
}

const companies = [
  { key: 'harbor', name: 'Demo Scale Harbor Closets (invented)', weight: 30 },
  { key: 'ridge', name: 'Demo Scale Ridge Laundry Fitters (invented)', weight: 20 },
  { key: 'meadow', name: 'Demo Scale Meadow Renovations (invented)', weight: 15 },
  { key: 'canyon', name: 'Demo Scale Canyon Installers (invented)', weight: 10 },
  { key: 'prairie', name: 'Demo Scale Prairie Carpentry (invented)', weight: 10 },
  { key: 'delta', name: 'Demo Scale Delta Appliance Setters (invented)', weight: 7 },
  { key: 'summit', name: 'Demo Scale Summit Cabinets (invented)', weight: 5 },
  { key: 'grove', name: 'Demo Scale Grove Home Services (invented)', weight: 3 },
] as const;

const editionSets = [
  { building_edition: 'IRC 2018', electrical_edition: 'NEC 2017', plumbing_edition: 'IPC 2018', plumbing_family: 'IPC', mechanical_edition: 'IMC 2018', fuel_gas_edition: 'IFGC 2018' },
  { building_edition: 'IRC 2021', electrical_edition: 'NEC 2023', plumbing_edition: 'UPC 2021', plumbing_family: 'UPC', mechanical_edition: 'IMC 2021', fuel_gas_edition: 'IFGC 2021' },
  { building_edition: 'IRC 2021', electrical_edition: 'NEC 2020', plumbing_edition: 'IPC 2021', plumbing_family: 'IPC', mechanical_edition: 'IMC 2021', fuel_gas_edition: 'IFGC 2021' },
] as const;

const allJurisdictions = [
  { key: 'north-county', name: 'Demo Scale North County' },
  { key: 'river-city', name: 'Demo Scale River City' },
  { key: 'lake-township', name: 'Demo Scale Lake Township' },
  { key: 'hill-borough', name: 'Demo Scale Hill Borough' },
  { key: 'bay-village', name: 'Demo Scale Bay Village' },
  { key: 'plains-county', name: 'Demo Scale Plains County' },
] as const;

const streets = ['Example', 'Sample', 'Placeholder', 'Fictional', 'Imaginary', 'Pretend', 'Mockup', 'Draft', 'Sketch', 'Model'];
const streetKinds = ['Lane', 'Road', 'Court', 'Avenue', 'Way', 'Street', 'Place', 'Terrace'];
const closets = ['hall closet', 'walk-in closet', 'bypass-door closet', 'stacked closet', 'basement nook', 'mudroom closet'];

/** The demo plans with other enclosure depths and first exhaust pieces, as an installer's revisions would vary them. */
function planVariants(): PlanInput[] {
  const depthsIn = [30, 33, 36];
  const firstStraightFt = [2, 6, 12, 20];
  const out: PlanInput[] = [];
  for (const base of demoPlans) {
    for (const depth of depthsIn) {
      for (const ft of firstStraightFt) {
        const plan = structuredClone(base.plan) as PlanInput & { enclosure: Record<string, unknown>; exhaust?: { run?: Array<Record<string, unknown>> } };
        plan.enclosure.depth = `${depth} in`;
        const run = plan.exhaust?.run;
        if (run && run.length > 0 && 'straight' in run[0]) run[0] = { ...run[0], straight: `${ft} ft` };
        out.push(plan);
      }
    }
  }
  return out;
}

type Timings = Record<string, number>;

async function timed<T>(timings: Timings, label: string, work: () => Promise<T>): Promise<T> {
  const t0 = performance.now();
  const result = await work();
  timings[label] = Math.round(performance.now() - t0);
  return result;
}

function chunks<T>(xs: T[], size = BATCH): T[][] {
  const out: T[][] = [];
  for (let i = 0; i < xs.length; i += size) out.push(xs.slice(i, i + size));
  return out;
}

/** Is the scale scenario already in this database? */
export async function hasScaleScenario(db: DB): Promise<boolean> {
  return !!(await db.selectFrom('jurisdictions').select('id').where('slug', 'like', `${SCALE_SLUG_PREFIX}%`).executeTakeFirst());
}

/**
 * Writes the scale scenario. `db` must hold one connection (the evaluated results wait in temporary tables).
 * Needs the demo scenario's administrator (the rule sets' publisher). Returns counts and timings.
 */
export async function writeScaleScenario(db: DB, passwordHash: string, options: ScaleOptions = defaultScale) {
  const rng = random(SEED);
  const timings: Timings = {};
  const jurisdictions = allJurisdictions.slice(0, Math.min(Math.max(options.jurisdictions ?? allJurisdictions.length, 1), allJurisdictions.length));
  const admin = await db.selectFrom('users').select('id').where('email', '=', 'admin@nookpass.demo').executeTakeFirstOrThrow();

  // Companies, jurisdictions with two published rule set versions each (the second adds a local amendment, so
  // checks run under the first are what an impact run re-evaluates), installers and inspectors.
  const setup = await timed(timings, 'companiesJurisdictionsRuleSetsMs', async () => {
    const orgs = await db
      .insertInto('organizations')
      .values(companies.map((c, i) => ({ name: c.name, license_number: `DEMO-SCALE-${String(i + 1).padStart(4, '0')}`, is_demo: true })))
      .returning(['id', 'name', 'license_number'])
      .execute();
    const jurs: Array<{ id: string; slug: string; name: string; inspectorEmail: string; v1: RuleSetWithRules; v2: RuleSetWithRules }> = [];
    for (const [i, j] of jurisdictions.entries()) {
      const editions = editionSets[i % editionSets.length];
      const slug = `${SCALE_SLUG_PREFIX}${j.key}`;
      const inspectorEmail = `permits@${j.key}.${SCALE_EMAIL_DOMAIN}`;
      const row = await db
        .insertInto('jurisdictions')
        .values({
          slug, name: j.name, region: 'Demo Scale State (invented)', ...editions, inspector_email: inspectorEmail,
          amendment_notes: 'Demo jurisdiction for scale figures (invented).', is_demo: true,
        })
        .returning('id')
        .executeTakeFirstOrThrow();
      const asEditions = { building: editions.building_edition, electrical: editions.electrical_edition, plumbing: editions.plumbing_edition, plumbingFamily: editions.plumbing_family, mechanical: editions.mechanical_edition, fuelGas: editions.fuel_gas_edition };
      const first = buildRuleSet(asEditions);
      const v1 = await createPublishedVersion(db, { jurisdictionId: row.id, parameters: first.parameters, rules: first.rules, changelog: 'Version 1 (demo scale): the model codes as published.', actorUserId: admin.id });
      const second = buildRuleSet(asEditions, { parameters: { plumbing: { drainPanPolicy: 'over-finished-space', drainPanSection: `${j.key.toUpperCase()}-406.3 (local amendment, demo)` } } });
      const v2 = await createPublishedVersion(db, { jurisdictionId: row.id, parameters: second.parameters, rules: second.rules, changelog: 'Version 2 (demo scale): a washer over finished space needs a drain pan.', actorUserId: admin.id });
      jurs.push({ id: row.id, slug, name: j.name, inspectorEmail, v1: (await findRuleSetById(db, v1.id))!, v2: (await findRuleSetById(db, v2.id))! });
    }
    const people = [
      ...companies.flatMap((c, i) => [
        { email: `owner@${c.key}.${SCALE_EMAIL_DOMAIN}`, name: `Demo Scale Owner ${i + 1}`, role: 'installer' as const, organization_id: orgs[i].id, jurisdiction_id: null, is_owner: true },
        { email: `installer@${c.key}.${SCALE_EMAIL_DOMAIN}`, name: `Demo Scale Installer ${i + 1}`, role: 'installer' as const, organization_id: orgs[i].id, jurisdiction_id: null, is_owner: false },
      ]),
      ...jurs.map((j, i) => ({ email: `inspector@${jurisdictions[i].key}.${SCALE_EMAIL_DOMAIN}`, name: `Demo Scale Inspector ${i + 1}`, role: 'inspector' as const, organization_id: null, jurisdiction_id: j.id, is_owner: false })),
    ];
    const users = await db
      .insertInto('users')
      .values(people.map((p) => ({ ...p, password_hash: passwordHash, is_demo: true })))
      .returning(['id', 'email', 'organization_id', 'jurisdiction_id'])
      .execute();
    return { orgs, jurs, users };
  });

  // Every distinct (plan, rule set version) pair is evaluated once, by the engine, and kept in temporary tables.
  const variants = planVariants();
  const evaluations = await timed(timings, 'evaluationsMs', async () => {
    await sql`CREATE TEMPORARY TABLE scale_variants (v int PRIMARY KEY, plan jsonb NOT NULL, canonical jsonb NOT NULL) ON COMMIT PRESERVE ROWS`.execute(db);
    await sql`CREATE TEMPORARY TABLE scale_results (v int, rule_set_id uuid, inputs jsonb, facts jsonb, findings jsonb, summary jsonb, outcome text, duration_ms int, PRIMARY KEY (v, rule_set_id))`.execute(db);
    const parsed = variants.map((plan, v) => {
      const p = parsePlan(plan);
      if (!p.ok) throw new Error(`scale plan variant ${v} does not parse: ${JSON.stringify(p.errors.slice(0, 2))}`);
      return p.plan;
    });
    await sql`INSERT INTO scale_variants SELECT * FROM unnest(${variants.map((_, v) => v)}::int[], ${variants.map((p) => JSON.stringify(p))}::jsonb[], ${parsed.map((p) => JSON.stringify(p))}::jsonb[])`.execute(db);
    const summaries = new Map<string, { summary: EvaluationSummary; outcome: string }>();
    let count = 0;
    for (const j of setup.jurs) {
      for (const set of [j.v1, j.v2]) {
        const rows: Array<[number, string, string, string, string, string, string, number]> = [];
        for (const [v, plan] of parsed.entries()) {
          const t0 = performance.now();
          const evaluation = withoutAdminNotes(await evaluate({ id: set.id, jurisdiction: set.jurisdictionSlug, version: set.version, parameters: set.parameters, rules: set.rules }, plan));
          const durationMs = performance.now() - t0;
          const outcome = outcomeOf(evaluation.summary);
          summaries.set(`${v}:${set.id}`, { summary: evaluation.summary, outcome });
          rows.push([
            v, set.id,
            JSON.stringify({ plan: variants[v], canonical: plan, planSchemaVersion: PLAN_SCHEMA_VERSION }),
            JSON.stringify(evaluation.facts), JSON.stringify(evaluation.findings), JSON.stringify(evaluation.summary), outcome, Math.max(1, Math.round(durationMs)),
          ]);
          count++;
        }
        const col = (k: number) => rows.map((r) => r[k]);
        await sql`INSERT INTO scale_results SELECT * FROM unnest(${col(0)}::int[], ${col(1)}::uuid[], ${col(2)}::jsonb[], ${col(3)}::jsonb[], ${col(4)}::jsonb[], ${col(5)}::jsonb[], ${col(6)}::text[], ${col(7)}::int[])`.execute(db);
      }
    }
    return { count, summaries };
  });

  // Projects, their revisions and a check of each revision, and reports of the latest checks.
  const projectRows: Array<{ id: string; org: number; jur: number; name: string; address: string; permit: string | null; archived: Date | null; created: Date; updated: Date; author: string }> = [];
  const revisionRows: Array<{ id: string; project: string; number: number; variant: number; author: string; at: Date }> = [];
  const checkRows: Array<{ id: string; project: string; revision: string; variant: number; ruleSet: string; author: string; at: Date }> = [];
  const reportRows: Array<{ id: string; check: string; code: string; snapshot: string; author: string; at: Date; project: string; jur: number }> = [];
  const reviewRows: Array<{ id: string; report: string; inspector: string; outcome: 'approved' | 'corrections-needed'; at: Date }> = [];
  const installersOf = (orgIndex: number) => setup.users.filter((u) => u.organization_id === setup.orgs[orgIndex].id).map((u) => u.id);
  const inspectorOf = (jurIndex: number) => setup.users.find((u) => u.jurisdiction_id === setup.jurs[jurIndex].id)!.id;
  const baseCount = demoPlans.length;
  const perBase = variants.length / baseCount;

  for (let i = 0; i < options.projects; i++) {
    const org = rng.weighted(companies.map((c) => c.weight));
    const jur = rng.int(jurisdictions.length);
    const author = rng.pick(installersOf(org));
    const created = new Date(ANCHOR - (365 - (i * 365) / options.projects) * DAY - rng.int(DAY));
    const street = `${rng.pick(streets)} ${rng.pick(streetKinds)}`;
    const number = 1 + rng.int(9_899);
    const address = `${number} ${street}, ${setup.jurs[jur].name} (invented)`;
    const name = `Demo scale ${String(i + 1).padStart(5, '0')} — ${rng.pick(closets)}, ${number} ${street}`;
    const permit = rng.next() < 0.6 ? `DEMO-${String(26 - rng.int(2))}-${String(10_000 + i).padStart(6, '0')}` : null;
    const project = { id: rng.uuid(), org, jur, name, address, permit, archived: null as Date | null, created, updated: created, author };
    const base = rng.int(baseCount);
    let at = created.getTime();
    let lastCheck: (typeof checkRows)[number] | null = null;
    for (let n = 1; n <= options.revisionsPerProject; n++) {
      at += (1 + rng.int(10)) * DAY / 4;
      const variant = base * perBase + rng.int(perBase);
      const revision = { id: rng.uuid(), project: project.id, number: n, variant, author, at: new Date(at) };
      revisionRows.push(revision);
      // The last revision of about half the projects was checked after the jurisdiction's second version.
      const late = n === options.revisionsPerProject && rng.next() < 0.5;
      const ruleSet = late ? setup.jurs[jur].v2.id : setup.jurs[jur].v1.id;
      lastCheck = { id: rng.uuid(), project: project.id, revision: revision.id, variant, ruleSet, author, at: new Date(at + 5 * 60_000) };
      checkRows.push(lastCheck);
    }
    project.updated = lastCheck ? lastCheck.at : created;
    if (rng.next() < 0.04) project.archived = new Date(project.updated.getTime() + 30 * DAY);
    projectRows.push(project);

    // About a third of the open projects sent their latest check's report to the inspector; most of those have an outcome.
    if (lastCheck && !project.archived && rng.next() < 0.33) {
      const code = newReportCode(rng.bytes);
      const result = evaluations.summaries.get(`${lastCheck.variant}:${lastCheck.ruleSet}`)!;
      const set = [setup.jurs[jur].v1, setup.jurs[jur].v2].find((s) => s.id === lastCheck!.ruleSet)!;
      const snapshot = buildReportSnapshot({
        project: { name, siteAddress: address, permitNumber: permit, isDemo: true },
        jurisdiction: { slug: setup.jurs[jur].slug, name: setup.jurs[jur].name },
        organization: { name: setup.orgs[org].name, licenseNumber: setup.orgs[org].license_number },
        ruleSet: { version: set.version },
        check: { createdAt: lastCheck.at, summary: result.summary, outcome: result.outcome },
      });
      const report = { id: rng.uuid(), check: lastCheck.id, code, snapshot: JSON.stringify(snapshot), author, at: new Date(lastCheck.at.getTime() + 60 * 60_000), project: project.id, jur };
      reportRows.push(report);
      if (rng.next() < 0.6) {
        const outcome = result.outcome === 'pass' && rng.next() < 0.9 ? 'approved' : 'corrections-needed';
        reviewRows.push({ id: rng.uuid(), report: report.id, inspector: inspectorOf(jur), outcome, at: new Date(report.at.getTime() + (1 + rng.int(5)) * DAY) });
      }
    }
  }

  await timed(timings, 'projectsMs', async () => {
    for (const b of chunks(projectRows)) {
      await sql`INSERT INTO projects (id, organization_id, jurisdiction_id, name, site_address, permit_number, is_demo, archived_at, created_by, created_at, updated_at)
        SELECT id, org, jur, name, address, permit, true, archived, author, created, updated
        FROM unnest(${b.map((p) => p.id)}::uuid[], ${b.map((p) => setup.orgs[p.org].id)}::uuid[], ${b.map((p) => setup.jurs[p.jur].id)}::uuid[],
          ${b.map((p) => p.name)}::text[], ${b.map((p) => p.address)}::text[], ${b.map((p) => p.permit)}::text[], ${b.map((p) => p.archived)}::timestamptz[],
          ${b.map((p) => p.author)}::uuid[], ${b.map((p) => p.created)}::timestamptz[], ${b.map((p) => p.updated)}::timestamptz[])
          AS u(id, org, jur, name, address, permit, archived, author, created, updated)`.execute(db);
    }
  });
  await timed(timings, 'planRevisionsMs', async () => {
    for (const b of chunks(revisionRows)) {
      await sql`INSERT INTO plan_revisions (id, project_id, number, plan, canonical, schema_version, change_summary, created_by, created_at)
        SELECT u.id, u.project, u.number, v.plan, v.canonical, ${PLAN_SCHEMA_VERSION}, 'Plan revision (demo scale)', u.author, u.at
        FROM unnest(${b.map((r) => r.id)}::uuid[], ${b.map((r) => r.project)}::uuid[], ${b.map((r) => r.number)}::int[], ${b.map((r) => r.variant)}::int[],
          ${b.map((r) => r.author)}::uuid[], ${b.map((r) => r.at)}::timestamptz[]) AS u(id, project, number, variant, author, at)
        JOIN scale_variants v ON v.v = u.variant`.execute(db);
    }
  });
  await timed(timings, 'checksMs', async () => {
    for (const b of chunks(checkRows)) {
      await sql`INSERT INTO checks (id, project_id, plan_revision_id, rule_set_id, inputs, facts, findings, summary, schema_version, outcome, duration_ms, created_by, created_at)
        SELECT u.id, u.project, u.revision, u.rule_set, r.inputs, r.facts, r.findings, r.summary, ${CHECK_SCHEMA_VERSION}, r.outcome, r.duration_ms, u.author, u.at
        FROM unnest(${b.map((c) => c.id)}::uuid[], ${b.map((c) => c.project)}::uuid[], ${b.map((c) => c.revision)}::uuid[], ${b.map((c) => c.variant)}::int[],
          ${b.map((c) => c.ruleSet)}::uuid[], ${b.map((c) => c.author)}::uuid[], ${b.map((c) => c.at)}::timestamptz[]) AS u(id, project, revision, variant, rule_set, author, at)
        JOIN scale_results r ON r.v = u.variant AND r.rule_set_id = u.rule_set`.execute(db);
    }
  });
  // Reports stand for issued PDFs that were never rendered here: no file is stored, and the hash is of a
  // marker text no PDF can match, so they list and look up but never verify or download.
  await timed(timings, 'reportsSendsReviewsMs', async () => {
    for (const b of chunks(reportRows)) {
      await sql`INSERT INTO reports (id, check_id, code, sha256, byte_size, page_count, storage_key, attachment_ids, schema_version, snapshot, created_by, created_at)
        SELECT id, check_id, code, sha, 0, 0, 'demo-scale/no-file/' || code, '[]'::jsonb, ${REPORT_SCHEMA_VERSION}, snapshot, author, at
        FROM unnest(${b.map((r) => r.id)}::uuid[], ${b.map((r) => r.check)}::uuid[], ${b.map((r) => r.code)}::text[],
          ${b.map((r) => createHash('sha256').update(`demo scale report without a file: ${r.code}`).digest('hex'))}::text[],
          ${b.map((r) => r.snapshot)}::jsonb[], ${b.map((r) => r.author)}::uuid[], ${b.map((r) => r.at)}::timestamptz[]) AS u(id, check_id, code, sha, snapshot, author, at)`.execute(db);
      await sql`INSERT INTO report_sends (report_id, project_id, jurisdiction_id, to_email, status, to_inspector, created_by, created_at)
        SELECT report, project, jur, email, 'sent', true, author, at
        FROM unnest(${b.map((r) => r.id)}::uuid[], ${b.map((r) => r.project)}::uuid[], ${b.map((r) => setup.jurs[r.jur].id)}::uuid[],
          ${b.map((r) => setup.jurs[r.jur].inspectorEmail)}::text[], ${b.map((r) => r.author)}::uuid[], ${b.map((r) => new Date(r.at.getTime() + 10 * 60_000))}::timestamptz[])
          AS u(report, project, jur, email, author, at)`.execute(db);
    }
    for (const b of chunks(reviewRows)) {
      await sql`INSERT INTO inspection_reviews (id, report_id, created_by, outcome, comment, finding_comments, created_at)
        SELECT id, report, inspector, outcome, 'Reviewed (demo scale).', '{}'::jsonb, at
        FROM unnest(${b.map((r) => r.id)}::uuid[], ${b.map((r) => r.report)}::uuid[], ${b.map((r) => r.inspector)}::uuid[], ${b.map((r) => r.outcome)}::text[],
          ${b.map((r) => r.at)}::timestamptz[]) AS u(id, report, inspector, outcome, at)`.execute(db);
    }
  });
  await sql`DROP TABLE scale_results`.execute(db);
  await sql`DROP TABLE scale_variants`.execute(db);
  await timed(timings, 'analyzeMs', () => sql`ANALYZE`.execute(db));

  return {
    counts: {
      companies: setup.orgs.length, jurisdictions: setup.jurs.length, projects: projectRows.length, planRevisions: revisionRows.length,
      checks: checkRows.length, distinctEvaluations: evaluations.count, reports: reportRows.length, sends: reportRows.length, outcomes: reviewRows.length,
    },
    timings,
    jurisdictions: setup.jurs.map((j) => j.slug),
  };
}
