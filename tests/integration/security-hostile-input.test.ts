import { readFileSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import bcrypt from 'bcryptjs';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import { api, appDb, baseUrl, chunkedUpload, postJson, signIn } from './helpers';

/*
 * Hostile input against the write paths that take the richest JSON: stateless evaluations, plan
 * saves and rule-set drafts. Whatever arrives, the answer is never a 5xx; a refusal is a 400 whose
 * errors each name a path and say what is wrong. Runs are bounded (50-60 per property over HTTP)
 * and seeded by fast-check, which prints the seed and the shrunk counterexample on a failure.
 */

const db = appDb();
let installer: string;
let admin: string;
let projectId: string;
let draftId: string;
let draftRevision: number;
let draftParameters: Record<string, unknown>;
let draftRule: Record<string, unknown>;
let jurisdictionSlug: string;

const RUNS = 50;
const LIMIT = 512 * 1024; // lib/platform/http.ts

type Json = null | boolean | number | string | Json[] | { [k: string]: Json };
type Answer = { status: number; body: any };

beforeAll(async () => {
  [installer, admin] = await Promise.all([signIn('installer@nookpass.demo'), signIn('admin@nookpass.demo')]);
  const p = await api('/api/projects', postJson({ name: 'Hostile input (test)', siteAddress: '3 Fuzz Street', jurisdiction: 'demo-county' }, { cookie: installer }));
  expect(p.status).toBe(201);
  projectId = p.body.id;
  const slug = `it-hostile-${randomBytes(4).toString('hex')}`;
  jurisdictionSlug = slug;
  const j = await api(
    '/api/jurisdictions',
    postJson(
      {
        slug,
        name: 'IT hostile input (test)',
        region: 'Test State (invented)',
        editions: { building: 'IRC 2018', electrical: 'NEC 2017', plumbing: 'IPC 2018', plumbingFamily: 'IPC', mechanical: 'IMC 2018', fuelGas: 'IFGC 2018' },
        inspectorEmail: '',
        amendmentNotes: '',
        startFrom: 'baseline',
        publishChangelog: 'Version 1 (test).',
        confirm: true,
      },
      { cookie: admin },
    ),
  );
  expect(j.status, JSON.stringify(j.body)).toBe(201);
  const d = await api(`/api/jurisdictions/${slug}/rule-sets`, postJson({ from: 'published' }, { cookie: admin }));
  expect(d.status).toBe(201);
  draftId = d.body.id;
  const set = await api(`/api/rule-sets/${draftId}`, { cookie: admin });
  draftRevision = set.body.revision;
  draftParameters = set.body.parameters;
  draftRule = set.body.rules.find((r: { key: string }) => r.key === 'exhaust.developed-length');
}, 60_000);

afterAll(async () => {
  await db.destroy();
});

/** Every leaf path of a JSON value, as dotted paths the API uses in its errors ('exhaust.run.0.straight'). */
function leafPaths(value: unknown, prefix: string[] = []): string[][] {
  if (value !== null && typeof value === 'object') {
    const entries = Array.isArray(value) ? value.map((v, i) => [String(i), v] as const) : Object.entries(value);
    if (entries.length === 0) return [prefix];
    return entries.flatMap(([k, v]) => leafPaths(v, [...prefix, k]));
  }
  return [prefix];
}

function objectPaths(value: unknown, prefix: string[] = []): string[][] {
  if (value === null || typeof value !== 'object') return [];
  const own = Array.isArray(value) ? [] : [prefix];
  const entries = Array.isArray(value) ? value.map((v, i) => [String(i), v] as const) : Object.entries(value);
  return [...own, ...entries.flatMap(([k, v]) => objectPaths(v, [...prefix, k]))];
}

function setAt(value: unknown, path: string[], replacement: unknown): unknown {
  const copy = structuredClone(value) as Record<string, unknown>;
  let node: Record<string, unknown> = copy;
  for (const key of path.slice(0, -1)) node = node[key] as Record<string, unknown>;
  node[path[path.length - 1]] = replacement;
  return copy;
}

/** Values of the wrong kind, or of the right kind out of range: what a broken client or an attacker sends. */
// Lengths near the largest double (1e308 in) still crash the display formatter (see the known-bug test
// at the end); they are left out here so this property keeps guarding everything else.
const junkValue: fc.Arbitrary<Json> = fc.oneof(
  fc.constantFrom<Json>(null, true, -1, 0, 1e300, -1e300, 1e-12, '', ' ', '∞', 'NaN', '1e999', "1' OR '1'='1", '<script>alert(1)</script>', '../../etc/passwd', '\u0000', '30 parsecs', '99999999999 ft', [], {}),
  fc.string({ maxLength: 40 }),
  fc.double({ noNaN: true }),
  fc.integer(),
  fc.jsonValue({ maxDepth: 3 }) as fc.Arbitrary<Json>,
);
const junk = junkValue.filter((v) => !(typeof v === 'number' && Math.abs(v) > 1e300));

/** Two paths are related when one is the other or lies inside it: a refused field may be reported at its parent. */
function related(reported: string, changed: string): boolean {
  return reported === changed || changed.startsWith(`${reported}.`) || reported.startsWith(`${changed}.`);
}

/**
 * Where a broken plan field may be reported: at the field, or inside the object that holds it, since
 * cross-field checks name the sibling that no longer fits (a shorter door puts its hinges out of range).
 */
function nearChange(reported: string, changed: string): boolean {
  const parent = changed.split('.').slice(0, -1).join('.');
  return related(reported, changed) || related(reported, parent) || reported === NUL_PATH;
}

// lib/platform/http.ts answers text PostgreSQL cannot store (U+0000) on this path, as a last line of defence.
const NUL_PATH = '(request)';

function expectClearRefusal(res: Answer, what: string) {
  expect(res.status, `${what}: ${JSON.stringify(res.body)}`).toBe(400);
  expect(Array.isArray(res.body.errors) && res.body.errors.length > 0, what).toBe(true);
  for (const e of res.body.errors) {
    expect(typeof e.path === 'string' && e.path.length > 0, `${what}: path of ${JSON.stringify(e)}`).toBe(true);
    expect(typeof e.message === 'string' && e.message.trim().length > 3, `${what}: message of ${JSON.stringify(e)}`).toBe(true);
  }
}

function expectNoServerError(res: Answer, what: string) {
  expect(res.status, `${what}: ${JSON.stringify(res.body).slice(0, 500)}`).toBeLessThan(500);
}

const planPaths = leafPaths(hallClosetPassPlan);
const planObjects = objectPaths(hallClosetPassPlan);

/** A plan with one leaf replaced by junk, or an unknown field added to one of its objects. */
const brokenPlan = fc.oneof(
  fc.record({ path: fc.constantFrom(...planPaths), value: junk }).map(({ path, value }) => ({ plan: setAt(hallClosetPassPlan, path, value), changed: path.join('.'), extra: null as string | null })),
  fc
    .record({ path: fc.constantFrom(...planObjects), key: fc.string({ minLength: 1, maxLength: 12 }).filter((k) => !/^\d+$/.test(k) && k !== '__proto__') })
    .filter(({ path, key }) => {
      let node = hallClosetPassPlan as unknown as Record<string, unknown>;
      for (const k of path) node = node[k] as Record<string, unknown>;
      return !(key in node);
    })
    .map(({ path, key }) => ({ plan: setAt(hallClosetPassPlan, [...path, key], 1), changed: [...path, key].join('.'), extra: key as string | null })),
);

describe('POST /api/evaluations under hostile input', () => {
  it('answers any JSON body with 200 or a 400 naming paths, never a 5xx', { timeout: 120_000 }, async () => {
    await fc.assert(
      fc.asyncProperty(fc.oneof(fc.jsonValue({ maxDepth: 4 }), fc.record({ jurisdiction: junk, plan: junk }, { requiredKeys: [] })), async (body) => {
        const res = await api('/api/evaluations', postJson(body, { cookie: installer }));
        expectNoServerError(res, 'evaluation');
        if (res.status !== 200 && res.status !== 404) expectClearRefusal(res, 'evaluation');
      }),
      { numRuns: RUNS },
    );
  });

  it('names the field it refuses when one field of a good plan is broken', { timeout: 120_000 }, async () => {
    await fc.assert(
      fc.asyncProperty(brokenPlan, async ({ plan, changed, extra }) => {
        const res = await api('/api/evaluations', postJson({ jurisdiction: 'demo-county', plan }, { cookie: installer }));
        expectNoServerError(res, changed);
        if (res.status === 200) return; // the new value was acceptable (e.g. a length written as text)
        expectClearRefusal(res, changed);
        const paths: string[] = res.body.errors.map((e: { path: string }) => e.path);
        expect(paths.some((p) => nearChange(p, `plan.${changed}`)), `${changed} → ${paths.join(', ')}`).toBe(true);
        if (extra) expect(res.body.errors.some((e: { message: string }) => e.message.includes(extra)), `${changed}: the unknown field is named`).toBe(true);
      }),
      { numRuns: 60 },
    );
  });

  it('answers bytes that are not JSON with a 400 on (body)', { timeout: 60_000 }, async () => {
    await fc.assert(
      fc.asyncProperty(fc.string({ maxLength: 200 }).filter((s) => { try { JSON.parse(s); return false; } catch { return true; } }), async (text) => {
        const res = await api('/api/evaluations', { method: 'POST', cookie: installer, headers: { 'content-type': 'application/json' }, body: text });
        expectClearRefusal(res, JSON.stringify(text));
        expect(res.body.errors[0].path).toBe('(body)');
      }),
      { numRuns: 30 },
    );
  });
});

describe('plan saves under hostile input', () => {
  it('store a revision only for a plan that parses, and name the field otherwise', { timeout: 120_000 }, async () => {
    const count = async () => Number((await db.selectFrom('plan_revisions').select(db.fn.countAll<number>().as('n')).where('project_id', '=', projectId).executeTakeFirstOrThrow()).n);
    const before = await count();
    let saved = 0;
    await fc.assert(
      fc.asyncProperty(fc.oneof(brokenPlan, fc.jsonValue({ maxDepth: 3 }).map((plan) => ({ plan, changed: '', extra: null }))), async ({ plan, changed }) => {
        const res = await api(`/api/projects/${projectId}/plans`, postJson({ plan }, { cookie: installer }));
        expectNoServerError(res, changed);
        if (res.status === 201) {
          saved++;
          return;
        }
        expectClearRefusal(res, changed);
        if (changed) expect(res.body.errors.some((e: { path: string }) => nearChange(e.path, `plan.${changed}`)), `${changed} → ${JSON.stringify(res.body.errors)}`).toBe(true);
      }),
      { numRuns: RUNS },
    );
    expect(await count()).toBe(before + saved); // a refused save left nothing behind
  });
});

describe('rule-set drafts under hostile input', () => {
  it('save parameters that parse and name the parameter otherwise', { timeout: 120_000 }, async () => {
    const paths = leafPaths(draftParameters);
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...paths), junk, async (path, value) => {
        const parameters = setAt(draftParameters, path, value);
        const res = await api(`/api/rule-sets/${draftId}`, postJson({ revision: draftRevision, parameters }, { cookie: admin, method: 'PATCH' }));
        expectNoServerError(res, path.join('.'));
        if (res.status === 200) {
          draftRevision = res.body.revision;
          return;
        }
        expectClearRefusal(res, path.join('.'));
        const reported: string[] = res.body.errors.map((e: { path: string }) => e.path);
        expect(reported.some((p) => related(p, `parameters.${path.join('.')}`) || p === NUL_PATH), `${path.join('.')} → ${reported.join(', ')}`).toBe(true);
      }),
      { numRuns: RUNS },
    );
  });

  it('refuse a broken rule with a 400 under rule.*, never a 5xx, and keep the draft readable', { timeout: 120_000 }, async () => {
    const paths = leafPaths(draftRule).filter((p) => p[0] !== 'key'); // a changed key is a different rule (its own 400)
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...paths), junk, async (path, value) => {
        const rule = setAt(draftRule, path, value);
        const res = await api(`/api/rule-sets/${draftId}/rules/exhaust.developed-length`, postJson({ revision: draftRevision, rule }, { cookie: admin, method: 'PUT' }));
        expectNoServerError(res, path.join('.'));
        if (res.status === 200) {
          draftRevision = res.body.revision;
          return;
        }
        expectClearRefusal(res, path.join('.'));
        expect(res.body.errors.every((e: { path: string }) => e.path.startsWith('rule') || e.path === NUL_PATH), JSON.stringify(res.body.errors)).toBe(true);
      }),
      { numRuns: RUNS },
    );
    expect((await api(`/api/rule-sets/${draftId}`, { cookie: admin })).status).toBe(200);
  });
});

describe('oversized bodies', () => {
  const targets = () => [
    { method: 'POST', path: '/api/evaluations', cookie: installer },
    { method: 'POST', path: `/api/projects/${projectId}/plans`, cookie: installer },
    { method: 'PATCH', path: `/api/rule-sets/${draftId}`, cookie: admin },
  ];

  it('are refused with 413 by their declared length, before the JSON is looked at', async () => {
    // Broken JSON on purpose: a 400 would mean it was parsed before the size was checked.
    const body = '{' + ' '.repeat(LIMIT + 10);
    for (const t of targets()) {
      const res = await api(t.path, { method: t.method, cookie: t.cookie, headers: { 'content-type': 'application/json' }, body });
      expect(res.status, t.path).toBe(413);
      expect(res.body.error).toMatch(/over 512 KiB/);
    }
  });

  it('are refused while still arriving when sent chunked with no length, after about the limit', { timeout: 60_000 }, async () => {
    for (const t of targets()) {
      // The server answers once it has counted past 512 KiB, while the body is still open (chunkedUpload fails otherwise).
      const { status } = await endlessUpload(t.method, t.path, t.cookie);
      expect(status, t.path).toBe(413);
    }
  });
});

describe('chunked bodies with no length on the routes that take files and forms', () => {
  // Each is sent to 1 MiB past its limit and then held open; the server must answer without waiting for the
  // end, having held at most about the limit. Bounds: the limit, plus not-yet-collected chunks (server).
  // RSS comes from /proc/<pid>/status of the app server (helpers.appServerPid).
  const MiB = 1024 * 1024;
  let reportCode: string;

  beforeAll(async () => {
    expect((await api(`/api/projects/${projectId}/plans`, postJson({ plan: hallClosetPassPlan }, { cookie: installer }))).status).toBe(201);
    const check = await api(`/api/projects/${projectId}/checks`, postJson({}, { cookie: installer }));
    const res = await fetch(`${baseUrl}/api/checks/${check.body.id}/report`, { method: 'POST', headers: { cookie: installer } });
    await res.arrayBuffer();
    reportCode = res.headers.get('x-report-code')!;
    expect(reportCode).toBeTruthy();
  }, 60_000);

  it('the public verification hashes as it reads and refuses past 30 MB', { timeout: 120_000 }, async () => {
    const res = await chunkedUpload({ path: `/api/reports/${reportCode}/verify`, headers: { 'content-type': 'application/pdf', 'x-forwarded-for': '198.51.100.31' }, prefix: '%PDF-1.7\n', pauseAfterBytes: 31 * MiB });
    expect(res.status).toBe(413);
    expect(res.rssGrowthMiB, 'server RSS growth (MiB)').not.toBeNull();
    expect(res.rssGrowthMiB!).toBeLessThan(64);
  });

  it('an attachment upload is refused once the file passes 15 MB, without holding more', { timeout: 120_000 }, async () => {
    const boundary = 'hostile-boundary-7f3a';
    const head = `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="endless.pdf"\r\nContent-Type: application/pdf\r\n\r\n%PDF-1.7\n`;
    const logBefore = appLog().length;
    const res = await chunkedUpload({ path: `/api/projects/${projectId}/attachments`, headers: { cookie: installer, 'content-type': `multipart/form-data; boundary=${boundary}` }, prefix: head, pauseAfterBytes: 16 * MiB });
    expect(res.status).toBe(413);
    expect(res.rssGrowthMiB!).toBeLessThan(64);
    // The cut-off file part is put away quietly: nothing thrown out of the server process.
    await new Promise((r) => setTimeout(r, 500));
    expect(appLog().slice(logBefore)).not.toMatch(/uncaughtException|Unexpected end of file/);
  });

  it('the sign-in form is refused past 16 KiB before next-auth reads it', { timeout: 120_000 }, async () => {
    const res = await chunkedUpload({ path: '/api/auth/callback/credentials', headers: { 'content-type': 'application/x-www-form-urlencoded' }, prefix: 'email=a%40b.test&password=', pauseAfterBytes: MiB, fill: 0x61 });
    expect(res.status).toBe(413);
    expect(res.rssGrowthMiB!).toBeLessThan(64);
  });
});

/** The served app's own log (scripts/test.sh writes it to NOOKPASS_APP_LOG). */
function appLog(): string {
  const file = process.env.NOOKPASS_APP_LOG;
  if (!file) throw new Error('NOOKPASS_APP_LOG is not set: run the integration tests through npm test.');
  return readFileSync(file, 'utf8');
}

/** Writes a JSON-looking body in 64 KiB chunks until the server answers, holding it open after 2 MiB (the limit is 512 KiB); returns the status and bytes sent. */
function endlessUpload(method: string, path: string, cookie: string): Promise<{ status: number }> {
  return chunkedUpload({ method, path, headers: { cookie, 'content-type': 'application/json' }, prefix: '{"pad":"', pauseAfterBytes: 2 * 1024 * 1024 });
}

describe('hostile ids in the URL', () => {
  it('answer 404 (or 400), never a 5xx, whatever the segment holds', { timeout: 60_000 }, async () => {
    const routes = [
      (s: string) => `/api/projects/${s}`,
      (s: string) => `/api/checks/${s}`,
      (s: string) => `/api/attachments/${s}`,
      (s: string) => `/api/inspections/${s}`,
      (s: string) => `/api/reports/${s}/pdf`,
      (s: string) => `/api/rule-sets/${s}`,
      (s: string) => `/api/tokens/${s}`,
      (s: string) => `/api/projects/${projectId}/plans/${s}`,
    ];
    // Already percent-encoded on purpose: an encoded traversal and an encoded NUL byte.
    const preEncoded = new Set(['..%2F..%2Fetc%2Fpasswd', '%00']);
    const segment = fc.oneof(
      fc.constantFrom("'; DROP TABLE projects; --", ...preEncoded, '<script>', '1e9', '-1', 'NaN', '00000000-0000-0000-0000-00000000000g', 'a'.repeat(2000)),
      // '.' and '..' are path steps, which the server resolves (a 308 to the parent) before any handler runs.
      fc.string({ minLength: 1, maxLength: 60 }).filter((x) => x !== '.' && x !== '..'),
    );
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...routes), segment, async (path, s) => {
        const p = path(preEncoded.has(s) ? s : encodeURIComponent(s));
        const method = p.startsWith('/api/tokens/') ? 'DELETE' : 'GET';
        const res = await api(p, { method, cookie: /^\/api\/(rule-sets|inspections)\//.test(p) ? admin : installer });
        expect([400, 404], `${method} ${p}: ${res.status} ${JSON.stringify(res.body).slice(0, 200)}`).toContain(res.status);
      }),
      { numRuns: 60 },
    );
  });
});

describe('the NUL character', () => {
  // PostgreSQL text and jsonb cannot store U+0000; it must come back as a 400, not a failed insert (500).
  it('in a text field or an id is refused with a 400 and stores nothing', async () => {
    const name = `nul ${randomBytes(4).toString('hex')}`;
    const project = await api('/api/projects', postJson({ name: `${name}\u0000x`, siteAddress: '5 Nul Street', jurisdiction: 'demo-county' }, { cookie: installer }));
    expectClearRefusal(project, 'project name');
    expect(await db.selectFrom('projects').select('id').where('name', 'like', `${name}%`).execute()).toEqual([]);
    // A user of its own: the demo installer's ten tokens an hour are shared with other tests.
    const email = `nul-${randomBytes(4).toString('hex')}@example.test`;
    const org = await db.selectFrom('organizations').select('id').where('name', '=', 'Demo Second Company').executeTakeFirstOrThrow();
    await db.insertInto('users').values({ email, name: 'Nul Test', role: 'installer', organization_id: org.id, password_hash: await bcrypt.hash('nul-test-pw', 4) }).execute();
    const own = await signIn(email, 'nul-test-pw');
    expectClearRefusal(await api('/api/tokens', postJson({ name: 'tok\u0000en' }, { cookie: own })), 'token name');
    expectClearRefusal(await api(`/api/projects/${projectId}`, postJson({ notes: 'a\u0000b' }, { cookie: installer, method: 'PATCH' })), 'notes');
    for (const path of ['/api/reports/%00', '/api/reports/%00/pdf']) expect([400, 404], path).toContain((await api(path, { cookie: installer })).status);
  });
});

describe('numbers PostgreSQL cannot hold and text that is not Unicode', () => {
  // PostgreSQL `integer` is signed 32-bit (PostgreSQL 15 manual, 8.1.1): 2147483647 is the largest.
  const TOO_BIG = 2_147_483_648;

  it('a lone surrogate in a project or token name is a 400 naming the field, and nothing is stored', async () => {
    const name = `surrogate ${randomBytes(4).toString('hex')}`;
    const project = await api('/api/projects', postJson({ name: `${name}\ud800`, siteAddress: '6 Half Street', jurisdiction: 'demo-county' }, { cookie: installer }));
    expectClearRefusal(project, 'project name');
    expect(project.body.errors[0].path).toBe('name');
    expect(await db.selectFrom('projects').select('id').where('name', 'like', `${name}%`).execute()).toEqual([]);
    const token = await api('/api/tokens', postJson({ name: 'half \udc00 token' }, { cookie: installer }));
    expectClearRefusal(token, 'token name');
    expect(token.body.errors[0].path).toBe('name');
    // A whole pair is a real character and is kept.
    const emoji = await api('/api/projects', postJson({ name: `${name} \ud83d\ude00`, siteAddress: '6 Half Street', jurisdiction: 'demo-county' }, { cookie: installer }));
    expect(emoji.status, JSON.stringify(emoji.body)).toBe(201);
  });

  it('a plan revision number past the integer range is a 404, a body or query revision a 400 naming it', async () => {
    const plan = await api(`/api/projects/${projectId}/plans/${TOO_BIG}`, { cookie: installer });
    expect(plan.status, JSON.stringify(plan.body)).toBe(404);
    const check = await api(`/api/projects/${projectId}/checks`, postJson({ revision: TOO_BIG }, { cookie: installer }));
    expectClearRefusal(check, 'check revision');
    expect(check.body.errors[0].path).toBe('revision');
    const save = await api(`/api/rule-sets/${draftId}`, postJson({ revision: TOO_BIG, changelog: 'x' }, { cookie: admin, method: 'PATCH' }));
    expectClearRefusal(save, 'draft revision');
    expect(save.body.errors[0]).toMatchObject({ path: 'revision', message: expect.stringContaining('2,147,483,647') });
    const discard = await api(`/api/rule-sets/${draftId}?revision=${TOO_BIG}`, { cookie: admin, method: 'DELETE' });
    expectClearRefusal(discard, 'discard revision');
    expect(await api(`/api/rule-sets/${draftId}`, { cookie: admin }).then((r) => r.status)).toBe(200);
    const page = await api(`/api/projects?page=${10 ** 20}`, { cookie: installer });
    expectClearRefusal(page, 'project list page');
  });

  it('the version comparison page without both versions asks for them instead of failing', async () => {
    for (const query of ['', '?from=1', '?from=1&to=abc', `?from=1&to=${TOO_BIG}`]) {
      const res = await fetch(`${baseUrl}/rules/${jurisdictionSlug}/diff${query}`, { headers: { cookie: admin }, redirect: 'manual' });
      expect(res.status, query).toBe(200);
      expect(await res.text(), query).toContain('Pick the two versions to compare');
    }
    const ok = await fetch(`${baseUrl}/rules/${jurisdictionSlug}/diff?from=1&to=2`, { headers: { cookie: admin }, redirect: 'manual' });
    expect(ok.status).toBe(200);
  });
});

describe('known bug', () => {
  // lib/units formatLength: 1e308 in × 16 overflows to Infinity, so gcd(NaN, 16) recurses until the
  // stack overflows and the evaluation answers 500. Marked as failing until lib/units guards it (or the
  // plan schema caps lengths); when this starts passing, turn it into a plain it().
  it('a length near the largest double is refused with a 400 naming the field, not a 500', async () => {
    const plan = setAt(hallClosetPassPlan, ['dryer', 'height'], 1e308);
    const res = await api('/api/evaluations', postJson({ jurisdiction: 'demo-county', plan }, { cookie: installer }));
    expect(res.status).toBe(400);
    expect(res.body.errors[0]).toMatchObject({ path: 'plan.dryer.height', message: expect.stringContaining('longer than 1,000 ft') });
  });
});
