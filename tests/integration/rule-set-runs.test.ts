import { randomBytes } from 'node:crypto';
import PgBoss from 'pg-boss';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import { api, appDatabaseUrl, appDb, postJson, signIn } from './helpers';

/*
 * Impact and dry runs through the served app: started with a 202, polled to done, the stored result the same as the
 * synchronous routes' direct computation; the roles; bad input; a duplicated job. The jurisdiction is a throwaway
 * made through the admin API, so other tests' projects never change what is compared.
 */

const db = appDb();
let admin: string;
let installer: string;
let inspector: string;

// IRC 2021 M1502.4.6.1: 35 ft maximum developed length; the hall-closet plan develops 22 ft 3 in
// (IRC Table M1502.4.6.1), so an invented local amendment of 20 ft makes it fail.
const LOCAL_MAX_IN = 20 * 12;
const AMENDMENT = { parameter: 'exhaust.maxDevelopedLengthIn', citation: 'Ord. T-7 §1 (test)' };
const PROJECTS = 3;

type Run = { id: string; kind: string; state: string; done: number; total: number | null; result: unknown; error: string | null; draftRevision: number | null; ruleSetVersion: number; joined?: boolean };

let slug: string;
let draft: { id: string; revision: number };
const projectIds: string[] = [];

/** Polls the run until it is done or failed, keeping every done count seen. */
async function pollToEnd(path: string, ms = 60_000): Promise<{ run: Run; seen: Array<{ done: number; total: number | null }> }> {
  const seen: Array<{ done: number; total: number | null }> = [];
  const start = Date.now();
  for (;;) {
    const res = await api(path, { cookie: admin });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const run = res.body as Run;
    seen.push({ done: run.done, total: run.total });
    if (run.state === 'done' || run.state === 'failed') return { run, seen };
    if (Date.now() - start > ms) throw new Error(`${path} still ${run.state} after ${ms} ms`);
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}

beforeAll(async () => {
  [admin, installer, inspector] = await Promise.all([signIn('admin@nookpass.demo'), signIn('installer@nookpass.demo'), signIn('inspector@nookpass.demo')]);
  slug = `it-runs-${randomBytes(4).toString('hex')}`;
  const made = await api(
    '/api/jurisdictions',
    postJson(
      {
        slug,
        name: `IT runs ${slug} (test)`,
        region: 'Test State (invented)',
        editions: { building: 'IRC 2021', electrical: 'NEC 2023', plumbing: 'UPC 2021', plumbingFamily: 'UPC', mechanical: 'IMC 2021', fuelGas: 'IFGC 2021' },
        inspectorEmail: '',
        amendmentNotes: 'Throwaway test jurisdiction.',
        startFrom: 'baseline',
        publishChangelog: 'Version 1 (test): model codes as published.',
        confirm: true,
      },
      { cookie: admin },
    ),
  );
  expect(made.status, JSON.stringify(made.body)).toBe(201);
  // Projects checked under version 1, and one never checked.
  for (let i = 0; i < PROJECTS; i++) {
    const project = await api('/api/projects', postJson({ name: `IT runs ${slug} #${i + 1}`, siteAddress: `${i + 1} Test Way (invented)`, jurisdiction: slug }, { cookie: installer }));
    expect(project.status).toBe(201);
    projectIds.push(project.body.id);
    expect((await api(`/api/projects/${project.body.id}/plans`, postJson({ plan: hallClosetPassPlan }, { cookie: installer }))).status).toBe(201);
    if (i < PROJECTS - 1) expect((await api(`/api/projects/${project.body.id}/checks`, postJson({}, { cookie: installer }))).status).toBe(201);
  }
  const started = await api(`/api/jurisdictions/${slug}/rule-sets`, postJson({ from: 'published' }, { cookie: admin }));
  expect(started.status).toBe(201);
  const set = (await api(`/api/rule-sets/${started.body.id}`, { cookie: admin })).body;
  const parameters = { ...set.parameters, exhaust: { ...set.parameters.exhaust, maxDevelopedLengthIn: LOCAL_MAX_IN }, amendments: [AMENDMENT] };
  const saved = await api(`/api/rule-sets/${set.id}`, postJson({ revision: set.revision, parameters }, { cookie: admin, method: 'PATCH' }));
  expect(saved.status, JSON.stringify(saved.body)).toBe(200);
  draft = { id: set.id, revision: saved.body.revision };
}, 120_000);

afterAll(async () => {
  await db.destroy();
});

describe('a dry run as a job', () => {
  let run: Run;

  it('answers 202 at once, and the polled result equals the synchronous dry run', { timeout: 120_000 }, async () => {
    const start = await api(`/api/rule-sets/${draft.id}/dry-runs`, postJson({ revision: draft.revision }, { cookie: admin }));
    expect(start.status, JSON.stringify(start.body)).toBe(202);
    expect(start.body).toMatchObject({ kind: 'dry-run', draftRevision: draft.revision, result: null });
    expect(['queued', 'running', 'done']).toContain(start.body.state);
    expect(start.headers.get('location')).toBe(`/api/rule-sets/${draft.id}/dry-runs/${start.body.id}`);
    const polled = await pollToEnd(start.headers.get('location')!);
    run = polled.run;
    expect(run.state, run.error ?? '').toBe('done');
    const direct = await api(`/api/rule-sets/${draft.id}/dry-run`, postJson({}, { cookie: admin }));
    expect(direct.status).toBe(200);
    expect(run.result).toEqual(direct.body);
    // The demo plans and the jurisdiction's three projects; the amendment fails the checked plan.
    const result = run.result as { draft: { revision: number }; subjects: Array<{ id: string; after: { outcome: string } | null; changes: Array<{ ruleKey: string; statusChanged: boolean }> }> };
    expect(result.draft.revision).toBe(draft.revision);
    expect(run.total).toBe(result.subjects.length);
    expect(run.done).toBe(run.total);
    const project = result.subjects.find((s) => s.id === projectIds[0])!;
    expect(project.after?.outcome).toBe('fail');
    expect(project.changes.find((c) => c.ruleKey === 'exhaust.developed-length')?.statusChanged).toBe(true);
    // Done counts seen while polling only rise, and end at the total.
    const counts = polled.seen.filter((s) => s.total !== null).map((s) => s.done);
    expect(counts).toEqual([...counts].sort((a, b) => a - b));
    expect(counts.every((n) => n <= run.total!)).toBe(true);
    expect(counts.at(-1)).toBe(run.total);
  });

  it('keeps each run: asking again after it finished is a new run, the old one unchanged', { timeout: 120_000 }, async () => {
    const again = await api(`/api/rule-sets/${draft.id}/dry-runs`, postJson({}, { cookie: admin }));
    expect(again.status).toBe(202);
    expect(again.body.id).not.toBe(run.id);
    expect((await pollToEnd(`/api/rule-sets/${draft.id}/dry-runs/${again.body.id}`)).run.state).toBe('done');
    expect((await api(`/api/rule-sets/${draft.id}/dry-runs/${run.id}`, { cookie: admin })).body).toEqual(run);
  });

  it('a second job for a finished run does nothing', { timeout: 60_000 }, async () => {
    const before = await db.selectFrom('rule_set_runs').selectAll().where('id', '=', run.id).executeTakeFirstOrThrow();
    const audits = async () => (await db.selectFrom('audit_log').select('id').where('entity_id', '=', draft.id).where('action', '=', 'rule-set.dry-run').execute()).length;
    const auditsBefore = await audits();
    const boss = new PgBoss({ connectionString: appDatabaseUrl(), schema: 'pgboss', max: 1 });
    await boss.start();
    try {
      const jobId = (await boss.send('rule-set-run', { runId: run.id }))!;
      const start = Date.now();
      let job = await boss.getJobById('rule-set-run', jobId, { includeArchive: true });
      while (job?.state !== 'completed' && Date.now() - start < 30_000) {
        await new Promise((resolve) => setTimeout(resolve, 200));
        job = await boss.getJobById('rule-set-run', jobId, { includeArchive: true });
      }
      expect(job?.state).toBe('completed');
      expect(job?.output).toEqual({ value: 'not-claimed' });
    } finally {
      await boss.stop({ graceful: false, wait: true });
    }
    expect(await db.selectFrom('rule_set_runs').selectAll().where('id', '=', run.id).executeTakeFirstOrThrow()).toEqual(before);
    expect(await audits()).toBe(auditsBefore);
  });

  it('refuses a stale revision with 409, and bad input with 400 naming the field', async () => {
    const stale = await api(`/api/rule-sets/${draft.id}/dry-runs`, postJson({ revision: draft.revision - 1 }, { cookie: admin }));
    expect(stale.status).toBe(409);
    expect(stale.body.error).toContain(`revision ${draft.revision}`);
    const wrongType = await api(`/api/rule-sets/${draft.id}/dry-runs`, postJson({ revision: 'two' }, { cookie: admin }));
    expect(wrongType.status).toBe(400);
    expect(wrongType.body.errors.map((e: { path: string }) => e.path)).toEqual(['revision']);
    const unknown = await api(`/api/rule-sets/${draft.id}/dry-runs`, postJson({ revisions: 2 }, { cookie: admin }));
    expect(unknown.status).toBe(400);
    expect(unknown.body.errors[0].message).toContain('revisions');
    expect((await api(`/api/rule-sets/00000000-0000-4000-8000-000000000000/dry-runs`, postJson({}, { cookie: admin }))).status).toBe(404);
    expect((await api(`/api/rule-sets/${draft.id}/dry-runs/00000000-0000-4000-8000-000000000000`, { cookie: admin })).status).toBe(404);
    expect((await api(`/api/rule-sets/${draft.id}/dry-runs/not-a-uuid`, { cookie: admin })).status).toBe(404);
  });
});

describe('an impact run as a job', () => {
  let run: Run;

  it('answers 202 at once, and the polled result equals the synchronous impact', { timeout: 120_000 }, async () => {
    // Publish the draft: the checks made under version 1 are what the impact run re-evaluates.
    const published = await api(`/api/rule-sets/${draft.id}/publish`, postJson({ revision: draft.revision, changelog: 'Local amendment T-7 (test): 20 ft.', confirm: true }, { cookie: admin }));
    expect(published.status, JSON.stringify(published.body)).toBe(200);
    const start = await api(`/api/jurisdictions/${slug}/impact-runs`, postJson({ version: 2 }, { cookie: admin }));
    expect(start.status, JSON.stringify(start.body)).toBe(202);
    expect(start.body).toMatchObject({ kind: 'impact', ruleSetVersion: 2, draftRevision: null, result: null });
    const polled = await pollToEnd(start.headers.get('location')!);
    run = polled.run;
    expect(run.state, run.error ?? '').toBe('done');
    const direct = await api(`/api/jurisdictions/${slug}/impact`, { cookie: admin });
    expect(direct.status).toBe(200);
    expect(run.result).toEqual(direct.body);
    const result = run.result as { items: Array<{ projectId: string; state: string }> };
    expect(run.total).toBe(PROJECTS);
    expect(run.done).toBe(PROJECTS);
    expect(result.items.find((i) => i.projectId === projectIds[0])?.state).toBe('would-change');
    expect(result.items.find((i) => i.projectId === projectIds[PROJECTS - 1])?.state).toBe('never-checked');
    const counts = polled.seen.filter((s) => s.total !== null).map((s) => s.done);
    expect(counts).toEqual([...counts].sort((a, b) => a - b));
    expect(counts.at(-1)).toBe(PROJECTS);
  });

  it('refuses another version with 409, bad input with 400 naming the field, another jurisdiction’s run with 404', async () => {
    const stale = await api(`/api/jurisdictions/${slug}/impact-runs`, postJson({ version: 1 }, { cookie: admin }));
    expect(stale.status).toBe(409);
    const bad = await api(`/api/jurisdictions/${slug}/impact-runs`, postJson({ version: 0 }, { cookie: admin }));
    expect(bad.status).toBe(400);
    expect(bad.body.errors.map((e: { path: string }) => e.path)).toEqual(['version']);
    expect((await api(`/api/jurisdictions/demo-county/impact-runs/${run.id}`, { cookie: admin })).status).toBe(404);
    expect((await api(`/api/jurisdictions/no-such-place/impact-runs`, postJson({}, { cookie: admin }))).status).toBe(404);
  });
});

describe('who may start and read runs', () => {
  it('admins only: installers and inspectors get 403, nobody signed in 401', async () => {
    const runId = (await db.selectFrom('rule_set_runs').select('id').where('rule_set_id', '=', draft.id).where('kind', '=', 'dry-run').executeTakeFirstOrThrow()).id;
    const impactId = (await db.selectFrom('rule_set_runs').select('id').where('kind', '=', 'impact').orderBy('created_at', 'desc').executeTakeFirstOrThrow()).id;
    const calls: Array<[string, RequestInit]> = [
      [`/api/rule-sets/${draft.id}/dry-runs`, postJson({})],
      [`/api/rule-sets/${draft.id}/dry-runs/${runId}`, {}],
      [`/api/jurisdictions/${slug}/impact-runs`, postJson({})],
      [`/api/jurisdictions/${slug}/impact-runs/${impactId}`, {}],
    ];
    for (const [path, init] of calls) {
      expect((await api(path, { ...init, cookie: installer })).status, path).toBe(403);
      expect((await api(path, { ...init, cookie: inspector })).status, path).toBe(403);
      expect((await api(path, init)).status, path).toBe(401);
    }
  });
});
