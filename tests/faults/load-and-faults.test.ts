import { execFile } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import { promisify } from 'node:util';
import autocannon from 'autocannon';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateApiToken } from '@/lib/platform/auth/api-token';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import { api, appDb, baseUrl, inboxMessages, postJson, signIn, waitForMail, waitForMailState } from '../integration/helpers';

// Loopback only; every load is bounded in connections and seconds.
const run = promisify(execFile);
const suffix = process.env.NOOKPASS_FAKES_SUFFIX ?? '-test';
const db = appDb();
let cookie: string;
let token: string;
let projectId: string;
let checkId: string;
const figures: Record<string, unknown> = {};

function load(opts: autocannon.Options): Promise<autocannon.Result> {
  return new Promise((resolve, reject) => autocannon(opts, (err, res) => (err ? reject(err) : resolve(res))));
}
const evalBody = JSON.stringify({ jurisdiction: 'demo-county', plan: hallClosetPassPlan });
const evaluate = () =>
  fetch(`${baseUrl}/api/evaluations`, { method: 'POST', headers: { 'content-type': 'application/json', authorization: `Bearer ${token}` }, body: evalBody });
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function counts() {
  const n = async (t: 'plan_revisions' | 'checks' | 'attachments' | 'reports') =>
    Number((await db.selectFrom(t).select(db.fn.countAll<number>().as('n')).executeTakeFirstOrThrow()).n);
  return { plan_revisions: await n('plan_revisions'), checks: await n('checks'), attachments: await n('attachments'), reports: await n('reports') };
}

/*
 * The load comes from 50 integrations, each with its own person and token: evaluations are limited per token and
 * per person (lib/services/usage-limits.ts), and one token at hundreds a second would be refused by design.
 */
const LOAD_CLIENTS = 50;
let loadTokens: string[] = [];
let nextToken = 0;
const loadRequests = (): autocannon.Request[] => [
  {
    method: 'POST',
    path: '/api/evaluations',
    body: evalBody,
    setupRequest: (req) => ({
      ...req,
      headers: { ...req.headers, 'content-type': 'application/json', authorization: `Bearer ${loadTokens[nextToken++ % loadTokens.length]}` },
    }),
  },
];

async function newLoadTokens(organizationId: string): Promise<string[]> {
  const tag = Date.now().toString(36);
  const users = await db
    .insertInto('users')
    .values(Array.from({ length: LOAD_CLIENTS }, (_, i) => ({ email: `load-${tag}-${i}@example.test`, name: `Load client ${i} (test)`, role: 'installer' as const, organization_id: organizationId, password_hash: '!' })))
    .returning('id')
    .execute();
  const tokens = users.map(() => generateApiToken());
  await db
    .insertInto('api_tokens')
    .values(users.map((u, i) => ({ user_id: u.id, name: 'load test', token_hash: tokens[i].hash, token_prefix: tokens[i].displayPrefix, expires_at: new Date(Date.now() + 86_400_000) })))
    .execute();
  return tokens.map((t) => t.token);
}

beforeAll(async () => {
  cookie = await signIn('installer2@nookpass.demo');
  const org = await db.selectFrom('users').select('organization_id').where('email', '=', 'installer2@nookpass.demo').executeTakeFirstOrThrow();
  loadTokens = await newLoadTokens(org.organization_id!);
  token = (await api('/api/tokens', postJson({ name: 'fault tests' }, { cookie }))).body.token;
  projectId = (await api('/api/projects', postJson({ name: 'Fault test project', siteAddress: '1 Fault Lane', jurisdiction: 'demo-county' }, { cookie }))).body.id;
  await api(`/api/projects/${projectId}/plans`, postJson({ plan: hallClosetPassPlan }, { cookie }));
  checkId = (await api(`/api/projects/${projectId}/checks`, postJson({}, { cookie }))).body.id;
});
afterAll(async () => {
  mkdirSync('test-results', { recursive: true });
  writeFileSync('test-results/load-and-faults.json', JSON.stringify(figures, null, 2));
  console.log('[faults]', JSON.stringify(figures));
  await db.destroy();
});

describe('load', () => {
  it('serves 50 concurrent clients on /api/evaluations for 30 s with no errors', async () => {
    const r = await load({
      url: baseUrl,
      requests: loadRequests(),
      connections: LOAD_CLIENTS,
      duration: Number(process.env.NOOKPASS_LOAD_SECONDS ?? 30),
    });
    figures.load = { connections: 50, seconds: r.duration, requests: r.requests.total, rps: Math.round(r.requests.average), p50ms: r.latency.p50, p99ms: r.latency.p99, errors: r.errors, timeouts: r.timeouts, non2xx: r.non2xx };
    expect(r.requests.total).toBeGreaterThan(100);
    expect(r.errors).toBe(0);
    expect(r.timeouts).toBe(0);
    expect(r.non2xx).toBe(0);
  });
});

describe('PostgreSQL stopped during load', () => {
  it('answers 503 with a clear message while it is down, recovers within seconds, and loses nothing', async () => {
    const before = await counts();
    const background = load({
      url: baseUrl,
      requests: loadRequests(),
      connections: 10,
      duration: 14,
    });
    await sleep(2000);
    await run('bash', ['scripts/pg-ctl.sh', 'stop']);
    let down: Response | null = null;
    for (let i = 0; i < 20; i++) {
      down = await evaluate();
      if (down.status === 503) break;
      await sleep(250);
    }
    expect(down!.status).toBe(503);
    expect((await down!.json()).error).toMatch(/database is not reachable/i);
    const health = await fetch(`${baseUrl}/api/health`);
    expect(health.status).toBe(503);
    expect(await health.json()).toEqual({ ok: false, db: 'down' });
    // A save while the database is down fails cleanly and is not half-done.
    const save = await api(`/api/projects/${projectId}/plans`, postJson({ plan: hallClosetPassPlan }, { cookie }));
    expect(save.status).toBe(503);

    await sleep(1500);
    await run('bash', ['scripts/pg-ctl.sh', 'start']);
    const t0 = Date.now();
    let recovered = false;
    while (Date.now() - t0 < 15_000) {
      if ((await evaluate()).status === 200) {
        recovered = true;
        break;
      }
      await sleep(100);
    }
    const recoveryMs = Date.now() - t0;
    expect(recovered).toBe(true);
    const r = await background;
    figures.databaseOutage = { recoveryMs, backgroundRequests: r.requests.total, background2xx: r['2xx'], backgroundNon2xx: r.non2xx, backgroundErrors: r.errors };
    expect(recoveryMs).toBeLessThan(10_000);
    const after = await counts();
    expect(after.plan_revisions).toBe(before.plan_revisions);
    expect(after.checks).toBe(before.checks);
    // The failed save never happened; saving now works.
    expect((await api(`/api/projects/${projectId}/plans`, postJson({ plan: hallClosetPassPlan }, { cookie }))).status).toBe(201);
  });
});

describe('mail relay and file storage down', () => {
  it('answers a send at once while the mail server is down, and delivers the e-mail once, with no one acting, when it is back', async () => {
    await run('bash', ['scripts/fakes.sh', 'stop', 'smtp', suffix]);
    let mailId: string;
    let code: string;
    try {
      const started = Date.now();
      const res = await api(`/api/checks/${checkId}/send`, postJson({ confirmFailingFindings: true }, { cookie }));
      figures.sendWithMailDownMs = Date.now() - started;
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(res.body.mail.status).toBe('queued');
      mailId = res.body.mail.id;
      code = res.body.report.code;
      // The send is on record (the report is in the inspector's queue in NookPass); the e-mail waits in the outbox.
      const send = await db.selectFrom('report_sends').select(['status']).where('project_id', '=', projectId).orderBy('created_at', 'desc').executeTakeFirstOrThrow();
      expect(send.status).toBe('sent');
      // The relay refuses the connection: the attempt is recorded and retried.
      const failing = await waitForMailState(mailId, cookie, (m) => m.status === 'retrying', 20_000);
      expect(failing.attempts).toBeGreaterThanOrEqual(1);
      expect(failing.label).toMatch(/^failed, retrying \(\d+ of \d+ attempts made\)$/);
      expect((await db.selectFrom('mail_outbox').select('sent_at').where('id', '=', mailId).executeTakeFirstOrThrow()).sent_at).toBeNull();
      expect((await api(`/api/checks/${checkId}`, { cookie })).status).toBe(200);
    } finally {
      await run('bash', ['scripts/fakes.sh', 'start', 'smtp', suffix]);
    }
    const backAt = Date.now();
    const sent = await waitForMailState(mailId, cookie, (m) => m.status === 'sent', 60_000);
    figures.mailDeliveredAfterRelayBackMs = Date.now() - backAt;
    expect(sent.label).toBe('sent');
    await waitForMail((m) => m.subject.includes(code));
    // Counted once, also after a moment more for any late duplicate.
    await sleep(3_000);
    expect((await inboxMessages()).filter((m) => m.subject.includes(code))).toHaveLength(1);
  });

  it('says storage is unreachable, saves nothing of the upload or the report, and works on retry', async () => {
    const png = await sharp({ create: { width: 64, height: 48, channels: 3, background: '#357' } }).png().toBuffer();
    const upload = async () => {
      const form = new FormData();
      form.set('file', new Blob([new Uint8Array(png)], { type: 'image/png' }), 'termination.png');
      form.set('caption', 'Duct termination');
      const res = await fetch(`${baseUrl}/api/projects/${projectId}/attachments`, { method: 'POST', headers: { cookie }, body: form });
      return { status: res.status, body: await res.json() };
    };
    const before = await counts();
    await run('bash', ['scripts/fakes.sh', 'stop', 's3', suffix]);
    try {
      const res = await upload();
      expect(res.status).toBe(503);
      expect(res.body.error).toMatch(/storage is not reachable/i);
      const report = await fetch(`${baseUrl}/api/checks/${checkId}/report`, { method: 'POST', headers: { cookie } });
      expect(report.status).toBe(503);
      const after = await counts();
      expect(after.attachments).toBe(before.attachments);
      expect(after.reports).toBe(before.reports);
    } finally {
      await run('bash', ['scripts/fakes.sh', 'start', 's3', suffix]);
    }
    expect((await upload()).status).toBe(201);
    expect((await fetch(`${baseUrl}/api/checks/${checkId}/report`, { method: 'POST', headers: { cookie } })).status).toBe(200);
  });
});
