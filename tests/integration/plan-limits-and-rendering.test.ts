import sharp from 'sharp';
import { extractText, getDocumentProxy } from 'unpdf';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MAX_DOORS, MAX_EXHAUST_RUN_PIECES, MAX_HINGES_PER_DOOR } from '@/lib/domain/plan';
import { hallClosetPassPlan, largestAllowedPlan } from '@/tests/fixtures/plans';
import { api, appDb, baseUrl, postJson, signIn } from './helpers';

/*
 * The plan limits and report rendering against the served app: an oversized plan is refused quickly and
 * names its list; a revision stored before the limits (inserted here as an old row would be) still opens,
 * says it is too large to draw, and gets a report without drawings; and while the heaviest plan the limits
 * allow renders as a report, other requests are answered at once. Every wait here is bounded.
 */

const db = appDb();
let installer: string;

const hundredThousandHinges = () => Array.from({ length: 100_000 }, (_, i) => 1 + (i % 70));

async function newProject(name: string): Promise<string> {
  const p = await api('/api/projects', postJson({ name: `${name} (test)`, siteAddress: '9 Limit Street', jurisdiction: 'demo-county' }, { cookie: installer }));
  expect(p.status, JSON.stringify(p.body)).toBe(201);
  return p.body.id;
}

async function revisionCount(projectId: string): Promise<number> {
  const r = await db.selectFrom('plan_revisions').select(db.fn.countAll<number>().as('n')).where('project_id', '=', projectId).executeTakeFirstOrThrow();
  return Number(r.n);
}

/** A page or download with the signed-in cookie, timed. */
async function timed(path: string, init: RequestInit = {}) {
  const started = performance.now();
  const res = await fetch(`${baseUrl}${path}`, { ...init, headers: { cookie: installer, ...(init.headers ?? {}) }, redirect: 'manual', signal: AbortSignal.timeout(60_000) });
  const bytes = Buffer.from(await res.arrayBuffer());
  return { status: res.status, headers: res.headers, bytes, text: bytes.toString('utf8'), ms: performance.now() - started };
}

async function pdfText(pdf: Buffer): Promise<string> {
  const { text } = await extractText(await getDocumentProxy(new Uint8Array(pdf)), { mergePages: true });
  return text.replace(/\s+/g, ' ');
}

async function ping(): Promise<number> {
  const started = performance.now();
  const res = await fetch(`${baseUrl}/api/ping`, { signal: AbortSignal.timeout(30_000) });
  await res.arrayBuffer();
  expect(res.status).toBe(200);
  return performance.now() - started;
}

beforeAll(async () => {
  installer = await signIn('installer@nookpass.demo');
}, 60_000);

afterAll(async () => {
  await db.destroy();
});

describe('plans over the limits', () => {
  it('a plan with 100,000 hinge positions on one door is refused with a 400 naming plan.doors.0.hinges, quickly, and nothing is stored', async () => {
    const projectId = await newProject('Hundred thousand hinges');
    const plan = { ...hallClosetPassPlan, doors: [{ ...hallClosetPassPlan.doors[0], hinges: hundredThousandHinges() }] };
    const started = performance.now();
    const res = await api(`/api/projects/${projectId}/plans`, postJson({ plan }, { cookie: installer }));
    const ms = performance.now() - started;
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual([{ path: 'plan.doors.0.hinges', message: `Door 1, hinge positions: at most ${MAX_HINGES_PER_DOOR} hinge positions on a door; this plan has 100,000.` }]);
    expect(ms).toBeLessThan(2_000);
    expect(await revisionCount(projectId)).toBe(0);

    const evaluation = await api('/api/evaluations', postJson({ jurisdiction: 'demo-county', plan }, { cookie: installer }));
    expect(evaluation.status).toBe(400);
    expect(evaluation.body.errors.map((e: { path: string }) => e.path)).toEqual(['plan.doors.0.hinges']);
  });

  it('one list item over each limit is refused and the largest allowed plan is saved', async () => {
    const projectId = await newProject('At the limits');
    const over = { ...largestAllowedPlan, doors: [...largestAllowedPlan.doors, largestAllowedPlan.doors[0]], exhaust: { ...largestAllowedPlan.exhaust, run: [...largestAllowedPlan.exhaust.run, { straight: 6 }] } };
    const refused = await api(`/api/projects/${projectId}/plans`, postJson({ plan: over }, { cookie: installer }));
    expect(refused.status).toBe(400);
    expect(refused.body.errors).toEqual([
      { path: 'plan.exhaust.run', message: expect.stringContaining(`at most ${MAX_EXHAUST_RUN_PIECES} pieces in the exhaust route; this plan has ${MAX_EXHAUST_RUN_PIECES + 1}.`) },
      { path: 'plan.doors', message: expect.stringContaining(`at most ${MAX_DOORS} doors; this plan has ${MAX_DOORS + 1}.`) },
    ]);
    expect((await api(`/api/projects/${projectId}/plans`, postJson({ plan: largestAllowedPlan }, { cookie: installer }))).status).toBe(201);
  });

  it('are stated in the plan JSON Schema', async () => {
    const res = await api('/api/schema/plan');
    expect(res.status).toBe(200);
    expect(res.body.properties.doors.maxItems).toBe(MAX_DOORS);
    expect(res.body.properties.doors.items.properties.hinges.maxItems).toBe(MAX_HINGES_PER_DOOR);
    expect(res.body.properties.exhaust.properties.run.maxItems).toBe(MAX_EXHAUST_RUN_PIECES);
  });
});

describe('a revision stored before the limits', () => {
  let projectId: string;
  let checkId: string;

  beforeAll(async () => {
    // A real first revision and check, then an oversized revision and its check inserted directly, as rows
    // saved before the limits existed would be: 5,000 doors, the first with 100,000 hinge positions.
    projectId = await newProject('Stored before the limits');
    expect((await api(`/api/projects/${projectId}/plans`, postJson({ plan: hallClosetPassPlan }, { cookie: installer }))).status).toBe(201);
    const first = await api(`/api/projects/${projectId}/checks`, postJson({}, { cookie: installer }));
    expect(first.status, JSON.stringify(first.body)).toBe(201);
    const model = await db.selectFrom('checks').selectAll().where('id', '=', first.body.id).executeTakeFirstOrThrow();
    const door = hallClosetPassPlan.doors[0];
    const plan = { ...hallClosetPassPlan, doors: [{ ...door, hinges: hundredThousandHinges() }, ...Array.from({ length: 4_999 }, () => door)] };
    const revision = await db
      .insertInto('plan_revisions')
      .values({ project_id: projectId, number: 2, plan: JSON.stringify(plan), canonical: JSON.stringify({ units: 'imperial' }), change_summary: 'Saved before the plan limits (test)', created_by: model.created_by, schema_version: 0 })
      .returning('id')
      .executeTakeFirstOrThrow();
    const check = await db
      .insertInto('checks')
      .values({
        project_id: projectId,
        plan_revision_id: revision.id,
        rule_set_id: model.rule_set_id,
        inputs: JSON.stringify({ plan }),
        facts: JSON.stringify(model.facts),
        findings: JSON.stringify(model.findings),
        summary: JSON.stringify(model.summary),
        outcome: model.outcome,
        duration_ms: 1,
        created_by: model.created_by,
        schema_version: 0,
      })
      .returning('id')
      .executeTakeFirstOrThrow();
    checkId = check.id;
  }, 60_000);

  it('opens its drawing page quickly, saying it is too large to draw and naming the lists', { timeout: 90_000 }, async () => {
    const page = await timed(`/projects/${projectId}/drawing`);
    expect(page.status).toBe(200);
    expect(page.ms).toBeLessThan(10_000);
    for (const said of ['Revision 2 is too large to draw', 'Doors: at most 8 doors; this plan has 5,000.', 'Door 1, hinge positions: at most 12 hinge positions on a door; this plan has 100,000.']) {
      expect(page.text.includes(said), said).toBe(true);
    }
    expect(page.bytes.length).toBeLessThan(1_000_000);
    expect(await ping()).toBeLessThan(1_000); // the server is still there
  });

  it('leaves the project, its history, its checks and the plan editor viewable', { timeout: 90_000 }, async () => {
    const project = await timed(`/projects/${projectId}`);
    expect(project.status).toBe(200);
    expect(project.text.includes('Saved before the plan limits (test)'), 'the history lists revision 2').toBe(true);
    expect((await timed(`/projects/${projectId}/checks/${checkId}`)).status).toBe(200);
    const editor = await timed(`/projects/${projectId}/plan`);
    expect(editor.status).toBe(200);
    expect(editor.text.includes('holds more than a plan may have today'), 'the editor warns').toBe(true);
    expect(editor.text.includes('title="Save the plan first"'), 'a check waits for a save of what the editor shows').toBe(true);
    expect(editor.bytes.length).toBeLessThan(2_000_000);
    for (const r of [project, editor]) expect(r.ms).toBeLessThan(10_000);
    // Revision 1 still draws.
    const old = await timed(`/projects/${projectId}/drawing?revision=1`);
    expect(/Drawings of plan revision (<!-- -->)?1/.test(old.text), 'revision 1 is drawn').toBe(true);
  });

  it('gets a report that says the plan is too large to draw, with the findings of its check', { timeout: 90_000 }, async () => {
    const report = await timed(`/api/checks/${checkId}/report`, { method: 'POST' });
    expect(report.status, report.text.slice(0, 300)).toBe(200);
    expect(report.ms).toBeLessThan(30_000);
    const text = await pdfText(report.bytes);
    expect(text).toContain('Plan revision 2 is too large to draw, so this report has no drawings or hinge layout.');
    expect(text).toContain('Doors: at most 8 doors; this plan has 5,000.');
    expect(text).toContain('IRC 2018'); // the findings of the stored check, Demo County's edition
  });

  it('is not checked again as it stands: a new check names the list over its limit', async () => {
    const res = await api(`/api/projects/${projectId}/checks`, postJson({}, { cookie: installer }));
    expect(res.status).toBe(400);
    expect(res.body.errors.map((e: { path: string }) => e.path)).toEqual(['plan.doors']);
  });
});

describe('a report rendering', () => {
  it('leaves other requests answered at once: /api/ping median and 90th percentile under 100 ms during the heaviest allowed report', { timeout: 180_000 }, async () => {
    const projectId = await newProject('Heaviest allowed report');
    expect((await api(`/api/projects/${projectId}/plans`, postJson({ plan: largestAllowedPlan }, { cookie: installer }))).status).toBe(201);
    const photo = await sharp({ create: { width: 1600, height: 1200, channels: 3, background: '#7799bb' } }).jpeg({ quality: 85 }).toBuffer();
    for (const i of [1, 2, 3]) {
      const form = new FormData();
      form.set('file', new Blob([new Uint8Array(photo)], { type: 'image/jpeg' }), `closet-${i}.jpg`);
      form.set('caption', `Closet photo ${i} (test)`);
      const res = await fetch(`${baseUrl}/api/projects/${projectId}/attachments`, { method: 'POST', headers: { cookie: installer }, body: form });
      expect(res.status).toBe(201);
    }
    const check = await api(`/api/projects/${projectId}/checks`, postJson({}, { cookie: installer }));
    expect(check.status).toBe(201);
    await timed(`/api/checks/${check.body.id}/report`, { method: 'POST' }); // the worker thread has started and loaded its fonts
    // The same number of pings with nothing rendering: what this shared machine gives anyway.
    const baseline: number[] = [];
    for (let i = 0; i < 40; i++) {
      baseline.push(await ping());
      await new Promise((r) => setTimeout(r, 20));
    }

    let rendered: Awaited<ReturnType<typeof timed>> | null = null;
    const report = timed(`/api/checks/${check.body.id}/report`, { method: 'POST' }).then((r) => (rendered = r));
    const pings: number[] = [];
    const deadline = performance.now() + 90_000;
    while (!rendered && pings.length < 2_000 && performance.now() < deadline) {
      pings.push(await ping());
      await new Promise((r) => setTimeout(r, 20));
    }
    await report;
    const r = rendered as unknown as Awaited<ReturnType<typeof timed>>;
    expect(r.status).toBe(200);
    expect(r.headers.get('content-type')).toBe('application/pdf');
    expect(await pdfText(r.bytes)).toContain('Closet photo 3 (test)');
    const stats = (xs: number[]) => {
      const sorted = [...xs].sort((a, b) => a - b);
      return { n: xs.length, median: sorted[Math.floor(sorted.length / 2)], p90: sorted[Math.floor(0.9 * (sorted.length - 1))], max: sorted[sorted.length - 1] };
    };
    const during = stats(pings);
    const idle = stats(baseline);
    console.log(`[render] report ${Math.round(r.ms)} ms; /api/ping during it: n=${during.n}, median ${during.median.toFixed(1)} ms, 90th percentile ${during.p90.toFixed(1)} ms, max ${during.max.toFixed(1)} ms; with nothing rendering: median ${idle.median.toFixed(1)} ms, max ${idle.max.toFixed(1)} ms`);
    expect(during.n).toBeGreaterThan(5); // the render lasted long enough to measure something
    expect(during.median).toBeLessThan(100);
    expect(during.p90).toBeLessThan(100);
    // A render on the request thread holds a ping for most of the render (seconds for this plan) and lets few
    // others through. Other work on a busy two-core machine can stall a single ping for a few hundred ms while
    // the render's own thread takes a core, with or without the render, so the longest ping is bounded by a
    // quarter of the render, or by what the idle pings showed, rather than by 100 ms.
    expect(during.max).toBeLessThan(Math.max(100, 2 * idle.max, r.ms / 4));
  });
});
