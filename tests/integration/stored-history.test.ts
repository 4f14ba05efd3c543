import { randomBytes } from 'node:crypto';
import { extractText, getDocumentProxy } from 'unpdf';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { findRuleSetById, ruleToRow } from '@/db/rule-sets';
import { outcomeOf } from '@/lib/domain/checks/outcome';
import { CHECK_SCHEMA_VERSION } from '@/lib/domain/checks/stored';
import { evaluate, type Finding } from '@/lib/domain/engine';
import { PARAMETERS_SCHEMA_VERSION } from '@/lib/domain/params/upgrade';
import { parsePlan } from '@/lib/domain/plan';
import { PLAN_SCHEMA_VERSION } from '@/lib/domain/plan/upgrade';
import { REPORT_SCHEMA_VERSION } from '@/lib/domain/reports/stored';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import { api, appDb, baseUrl, postJson, signIn } from './helpers';

/*
 * History written before schema versions were recorded (version 0), inserted straight into the
 * database as old data would be, then read through the served app: the plan revision opens, its
 * stored check shows and reports as stored, and it still evaluates under a published rule set of
 * version 0. Version 0 has today's shape (see tests/unit/stored-history.test.ts for a made-up chain
 * with a renamed field and an added parameter); these tests hold every read path to the upgraders.
 */
const db = appDb();
const countyEditions = { building: 'IRC 2018', electrical: 'NEC 2017', plumbing: 'IPC 2018', plumbingFamily: 'IPC', mechanical: 'IMC 2018', fuelGas: 'IFGC 2018' };
// IRC 2018 M1502.4.5.1: 35 ft maximum developed length. The hall-closet demo plan develops
// 22 ft 3 in per IRC Table M1502.4.6.1 (as admin-rule-sets.test.ts works out).
const HALL_CLOSET_DEVELOPED = `22' 3"`;
// A local amendment of 20 ft (invented for the test), published as version 2 before versions were recorded.
const LOCAL_MAX_IN = 20 * 12;
// Only the stored check says this; re-evaluating could never produce it.
const STORED_MARK = 'zq7';

let admin: string;
let installer: string;
let installerId: string;
const j = { slug: '', id: '' };
let projectId: string;
let oldCheckId: string;
let oldFindings: Finding[];
let v2Id: string;

async function page(path: string, cookie: string) {
  const res = await fetch(`${baseUrl}${path}`, { headers: { cookie }, redirect: 'manual' });
  // React separates adjacent text with empty comments; drop them so sentences read whole.
  return { status: res.status, html: (await res.text()).replaceAll('<!-- -->', '') };
}

async function newJurisdiction(tag: string) {
  const slug = `it-${tag}-${randomBytes(4).toString('hex')}`;
  const res = await api(
    '/api/jurisdictions',
    postJson(
      { slug, name: `IT ${tag} (test)`, region: 'Test State (invented)', editions: countyEditions, inspectorEmail: '', amendmentNotes: 'Throwaway test jurisdiction.', startFrom: 'baseline', publishChangelog: 'Version 1 (test): model codes as published.', confirm: true },
      { cookie: admin },
    ),
  );
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return { slug, id: res.body.jurisdiction.id as string, v1Id: res.body.draft.id as string };
}

async function newProject(jurisdiction: string) {
  const res = await api('/api/projects', postJson({ name: `IT old history ${jurisdiction}`, siteAddress: '3 Archive Lane (invented)', jurisdiction }, { cookie: installer }));
  expect(res.status).toBe(201);
  return res.body.id as string;
}

function insertRevision(project: string, plan: unknown, schemaVersion: number) {
  const parsed = parsePlan(plan);
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.errors));
  return db
    .insertInto('plan_revisions')
    .values({ project_id: project, number: 1, plan: JSON.stringify(plan), canonical: JSON.stringify(parsed.plan), change_summary: 'First plan', created_by: installerId, schema_version: schemaVersion })
    .returning('id')
    .executeTakeFirstOrThrow();
}

beforeAll(async () => {
  [admin, installer] = await Promise.all([signIn('admin@nookpass.demo'), signIn('installer@nookpass.demo')]);
  installerId = (await db.selectFrom('users').select('id').where('email', '=', 'installer@nookpass.demo').executeTakeFirstOrThrow()).id;
  const made = await newJurisdiction('old');
  Object.assign(j, { slug: made.slug, id: made.id });
  projectId = await newProject(j.slug);

  // Version 0 rows, as the app wrote them before versions were recorded.
  const revision = await insertRevision(projectId, hallClosetPassPlan, 0);
  const v1 = (await findRuleSetById(db, made.v1Id))!;
  const canonical = parsePlan(hallClosetPassPlan);
  if (!canonical.ok) throw new Error('fixture does not parse');
  const evaluation = await evaluate({ jurisdiction: j.slug, version: 1, parameters: v1.parameters, rules: v1.rules }, canonical.plan);
  oldFindings = evaluation.findings.map((f) => (f.ruleKey === 'exhaust.developed-length' ? { ...f, message: `${f.message} ${STORED_MARK}` } : f));
  oldCheckId = (
    await db
      .insertInto('checks')
      .values({
        project_id: projectId,
        plan_revision_id: revision.id,
        rule_set_id: v1.id,
        inputs: JSON.stringify({ plan: hallClosetPassPlan, canonical: canonical.plan }),
        facts: JSON.stringify(evaluation.facts),
        findings: JSON.stringify(oldFindings),
        summary: JSON.stringify(evaluation.summary),
        outcome: outcomeOf(evaluation.summary),
        duration_ms: 5,
        created_by: installerId,
        created_at: new Date(Date.now() - 3_600_000),
        schema_version: 0,
      })
      .returning('id')
      .executeTakeFirstOrThrow()
  ).id;

  // Version 2 of the rule set, published under parameters version 0; version 1 retired.
  const parameters = { ...v1.parameters, exhaust: { ...v1.parameters.exhaust, maxDevelopedLengthIn: LOCAL_MAX_IN } };
  await db.transaction().execute(async (trx) => {
    v2Id = (await trx.insertInto('rule_sets').values({ jurisdiction_id: j.id, version: 2, parameters: JSON.stringify(parameters), based_on_id: v1.id, schema_version: 0 }).returning('id').executeTakeFirstOrThrow()).id;
    await trx.insertInto('rules').values(v1.rules.map((r, i) => ruleToRow(r, v2Id, i))).execute();
    await trx.updateTable('rule_sets').set({ status: 'retired', retired_at: new Date() }).where('id', '=', v1.id).execute();
    await trx.updateTable('rule_sets').set({ status: 'published', published_at: new Date(), changelog: 'Local amendment (test): maximum developed length 20 ft.' }).where('id', '=', v2Id).execute();
  });
});
afterAll(async () => {
  await db.destroy();
});

describe('a plan revision of version 0', () => {
  it('opens through the API, in today’s shape', async () => {
    for (const n of ['1', 'latest']) {
      const res = await api(`/api/projects/${projectId}/plans/${n}`, { cookie: installer });
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({ number: 1, plan: hallClosetPassPlan });
      expect(res.body.canonical).toEqual(JSON.parse(JSON.stringify((parsePlan(hallClosetPassPlan) as { plan: unknown }).plan)));
    }
  });

  it('opens in the plan editor and the drawing page', async () => {
    const editor = await page(`/projects/${projectId}/plan`, installer);
    expect(editor.status).toBe(200);
    expect(editor.html).toContain('27-1/4'); // the doors' width as entered
    const drawing = await page(`/projects/${projectId}/drawing`, installer);
    expect(drawing.status).toBe(200);
    expect(drawing.html).toContain('Drawings of plan revision 1');
    expect(drawing.html).toContain('Marked from the check of');
  });
});

describe('a check of version 0', () => {
  it('shows as stored on the check page and through the API, never re-evaluated', async () => {
    const view = await page(`/projects/${projectId}/checks/${oldCheckId}`, installer);
    expect(view.status).toBe(200);
    expect(view.html).toContain(STORED_MARK);
    expect(view.html).toContain('rule set version 1');
    const res = await api(`/api/checks/${oldCheckId}`, { cookie: installer });
    expect(res.status).toBe(200);
    expect(res.body.findings).toEqual(JSON.parse(JSON.stringify(oldFindings)));
    expect(res.body.inputs.plan).toEqual(hallClosetPassPlan);
  });

  it('issues a report from its stored findings, drawn from its plan under its own rule set', async () => {
    const res = await fetch(`${baseUrl}/api/checks/${oldCheckId}/report`, { method: 'POST', headers: { cookie: installer } });
    expect(res.status).toBe(200);
    const doc = await getDocumentProxy(new Uint8Array(await res.arrayBuffer()));
    const { text } = await extractText(doc, { mergePages: true });
    const flat = text.replace(/\s+/g, ' ');
    expect(flat).toContain(STORED_MARK);
    // Checked under version 1: the model code's 35 ft (IRC 2018 M1502.4.5.1), not version 2's 20 ft.
    expect(flat).toContain(`35' 0"`);
    const row = await db.selectFrom('reports').select('schema_version').where('code', '=', res.headers.get('x-report-code')!).executeTakeFirstOrThrow();
    expect(row.schema_version).toBe(REPORT_SCHEMA_VERSION);
  });

  it('is compared with the published rule set of version 0 on the impact page', async () => {
    const res = await api(`/api/jurisdictions/${j.slug}/impact`, { cookie: admin });
    expect(res.status).toBe(200);
    expect(res.body.published).toMatchObject({ id: v2Id, version: 2 });
    const item = res.body.items.find((i: { projectId: string }) => i.projectId === projectId);
    expect(item).toMatchObject({ state: 'would-change', latestCheck: { id: oldCheckId, version: 1, outcome: 'pass' }, outcomeNow: 'fail', error: null });
    expect(item.changes[0]).toMatchObject({ ruleKey: 'exhaust.developed-length', from: { status: 'pass' }, to: { status: 'fail', limit: `20' 0"`, measured: HALL_CLOSET_DEVELOPED } });
  });
});

describe('a published rule set of version 0', () => {
  it('is copied into a new draft in today’s shape, and a dry run evaluates the old revision under both', async () => {
    const started = await api(`/api/jurisdictions/${j.slug}/rule-sets`, postJson({ from: 'published' }, { cookie: admin }));
    expect(started.status, JSON.stringify(started.body)).toBe(201);
    const draft = started.body as { id: string; revision: number };
    const stored = await db.selectFrom('rule_sets').select(['schema_version', 'parameters']).where('id', '=', draft.id).executeTakeFirstOrThrow();
    expect(stored.schema_version).toBe(PARAMETERS_SCHEMA_VERSION);
    expect((stored.parameters as { exhaust: { maxDevelopedLengthIn: number } }).exhaust.maxDevelopedLengthIn).toBe(LOCAL_MAX_IN);

    // Back to the model code's 35 ft in the draft (IRC 2018 M1502.4.5.1).
    const set = (await api(`/api/rule-sets/${draft.id}`, { cookie: admin })).body;
    const saved = await api(`/api/rule-sets/${draft.id}`, postJson({ revision: draft.revision, parameters: { ...set.parameters, exhaust: { ...set.parameters.exhaust, maxDevelopedLengthIn: 35 * 12 } } }, { cookie: admin, method: 'PATCH' }));
    expect(saved.status).toBe(200);
    const dry = await api(`/api/rule-sets/${draft.id}/dry-run`, postJson({}, { cookie: admin }));
    expect(dry.status).toBe(200);
    expect(dry.body.published).toMatchObject({ id: v2Id, version: 2 });
    const subject = dry.body.subjects.find((s: { id: string }) => s.id === projectId);
    expect(subject).toMatchObject({ kind: 'project', error: null, before: { outcome: 'fail' }, after: { outcome: 'pass' } });
    expect(subject.changes[0]).toMatchObject({ ruleKey: 'exhaust.developed-length', from: { status: 'fail', limit: `20' 0"` }, to: { status: 'pass', limit: `35' 0"` } });
  });

  it('evaluates a new check of the old revision, stored in today’s shape', async () => {
    const res = await api(`/api/projects/${projectId}/checks`, postJson({}, { cookie: installer }));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ planRevision: { number: 1 }, ruleSet: { id: v2Id, version: 2 }, outcome: 'fail' });
    const dl = res.body.findings.find((f: Finding) => f.ruleKey === 'exhaust.developed-length');
    expect(dl).toMatchObject({ status: 'fail', display: { measured: HALL_CLOSET_DEVELOPED, limit: `20' 0"` } });
    const row = await db.selectFrom('checks').select(['schema_version', 'inputs']).where('id', '=', res.body.id).executeTakeFirstOrThrow();
    expect(row.schema_version).toBe(CHECK_SCHEMA_VERSION);
    expect(row.inputs).toMatchObject({ plan: hallClosetPassPlan, planSchemaVersion: PLAN_SCHEMA_VERSION });
  });

  it('saving over the old revision compares with it in today’s shape', async () => {
    const changed = { ...hallClosetPassPlan, plumbing: { ...hallClosetPassPlan.plumbing, standpipeHeight: 40 } };
    const res = await api(`/api/projects/${projectId}/plans`, postJson({ plan: changed }, { cookie: installer }));
    expect(res.status).toBe(201);
    expect(res.body.revision).toMatchObject({ number: 2 });
    expect(res.body.changes.map((c: { path: string }) => c.path)).toEqual(['plumbing.standpipeHeight']);
    const row = await db.selectFrom('plan_revisions').select('schema_version').where('id', '=', res.body.revision.id).executeTakeFirstOrThrow();
    expect(row.schema_version).toBe(PLAN_SCHEMA_VERSION);
  });
});

describe('a row written by a newer build', () => {
  it('is refused with an error, never read in a shape this build does not know', async () => {
    const other = await newJurisdiction('newer');
    const project = await newProject(other.slug);
    const revision = await insertRevision(project, hallClosetPassPlan, PLAN_SCHEMA_VERSION + 1);
    const res = await api(`/api/projects/${project}/plans/1`, { cookie: installer });
    expect(res.status).toBe(500);
    expect(res.body).toEqual({ error: 'Something went wrong on our side.', requestId: expect.any(String) });
    expect((await api(`/api/projects/${project}/checks`, postJson({}, { cookie: installer }))).status).toBe(500);
    expect(await db.selectFrom('checks').select('id').where('project_id', '=', project).execute()).toEqual([]);

    const check = await db
      .insertInto('checks')
      .values({
        project_id: project, plan_revision_id: revision.id, rule_set_id: other.v1Id, inputs: '{}', facts: '{}', findings: '[]', summary: '{}', outcome: 'pass',
        duration_ms: 1, created_by: installerId, schema_version: CHECK_SCHEMA_VERSION + 1,
      })
      .returning('id')
      .executeTakeFirstOrThrow();
    expect((await api(`/api/checks/${check.id}`, { cookie: installer })).status).toBe(500);
    expect((await api(`/api/checks/${check.id}/report`, { cookie: installer, method: 'POST' })).status).toBe(500);

    const v1 = await db.selectFrom('rule_sets').select('parameters').where('id', '=', other.v1Id).executeTakeFirstOrThrow();
    const draft = await db
      .insertInto('rule_sets')
      .values({ jurisdiction_id: other.id, version: 2, parameters: JSON.stringify(v1.parameters), based_on_id: other.v1Id, schema_version: PARAMETERS_SCHEMA_VERSION + 1 })
      .returning('id')
      .executeTakeFirstOrThrow();
    expect((await api(`/api/rule-sets/${draft.id}`, { cookie: admin })).status).toBe(500);
    // Out of the installer's open projects, so no other suite meets these rows.
    await db.updateTable('projects').set({ archived_at: new Date() }).where('id', '=', project).execute();
  });
});
