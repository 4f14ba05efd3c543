import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { createServer } from 'node:net';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import bcrypt from 'bcryptjs';
import { sql } from 'kysely';
import PgBoss from 'pg-boss';
import { api, apiAt, appDatabaseUrl, appDb, baseUrl, inboxMessages, newInstallerCompany, postJson, signIn, signOut, testAddress, until } from './helpers';

/*
 * NookPass as two app servers over one database and one file store: the served test app (A) and a second
 * `next start` of the same build (B) started here on a free port. Whatever one server does, the other must
 * see on its next request: sessions, token revocations, publications, and the counts of shared limits.
 */

let second: ChildProcess | null = null;
let serverB = '';
let output = '';

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const address = probe.address();
      probe.close(() => (typeof address === 'object' && address ? resolve(address.port) : reject(new Error('no port'))));
    });
  });
}

beforeAll(async () => {
  const port = await freePort();
  serverB = `http://127.0.0.1:${port}`;
  second = spawn(process.execPath, [path.join('node_modules', 'next', 'dist', 'bin', 'next'), 'start', '-H', '127.0.0.1', '-p', String(port)], {
    env: { ...process.env, NEXTAUTH_URL: serverB, NOOKPASS_BASE_URL: serverB },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  second.stdout?.on('data', (chunk) => (output += chunk));
  second.stderr?.on('data', (chunk) => (output += chunk));
  await until(
    'the second app server answering',
    async () => {
      if (second?.exitCode !== null) throw new Error(`the second app server exited:\n${output}`);
      const res = await fetch(`${serverB}/api/ping`).catch(() => null);
      return res?.ok ? true : null;
    },
    90_000,
    250,
  );
}, 120_000);

afterAll(async () => {
  if (second && second.exitCode === null) {
    const exited = new Promise((resolve) => second?.once('exit', resolve));
    second.kill('SIGTERM');
    await exited;
  }
});

describe('two app servers over one database', () => {
  it('a session started on one is valid on the other, and signing out on one ends it on both', async () => {
    const cookie = await signIn('installer2@nookpass.demo');
    const onB = await apiAt(serverB, '/api/me', { cookie });
    expect(onB.status).toBe(200);
    expect(onB.body.user.email).toBe('installer2@nookpass.demo');
    expect(await signOut(cookie)).toBeLessThan(400);
    expect((await apiAt(serverB, '/api/me', { cookie })).status).toBe(401);
  });

  it('a token revoked on one server is refused by the other within a second, though the other had it in memory', async () => {
    // A person of their own: tokens are limited to ten an hour per person, and other tests make them for the demo installer.
    const db = appDb();
    const { cookie } = await newInstallerCompany(db, 'two servers').finally(() => db.destroy());
    const created = await api('/api/tokens', postJson({ name: `two-servers ${randomBytes(3).toString('hex')}`, expiresInDays: 1 }, { cookie }));
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const token = created.body.token as string;
    for (let i = 0; i < 3; i++) expect((await apiAt(serverB, '/api/me', { token })).status).toBe(200);
    expect((await api(`/api/tokens/${created.body.id}`, { cookie, method: 'DELETE' })).status).toBe(200);
    const refused = await until('server B refusing the revoked token', async () => {
      const res = await apiAt(serverB, '/api/me', { token });
      return res.status === 401 ? res : null;
    }, 1_000, 20);
    expect(refused.value.body.error).toMatch(/unknown or revoked/);
  });

  it('a rule set published on one server is used by the other’s next evaluation', async () => {
    const admin = await signIn('admin@nookpass.demo');
    const installer = await signIn('installer@nookpass.demo');
    const slug = `it-two-servers-${randomBytes(3).toString('hex')}`;
    const editions = { building: 'IRC 2021', electrical: 'NEC 2023', plumbing: 'IPC 2021', plumbingFamily: 'IPC', mechanical: 'IMC 2021', fuelGas: 'IFGC 2021' };
    const made = await api(
      '/api/jurisdictions',
      postJson(
        { slug, name: `IT two servers ${slug.slice(-6)} (test)`, region: 'Test State (invented)', editions, inspectorEmail: '', amendmentNotes: 'Throwaway test jurisdiction.', startFrom: 'baseline', publishChangelog: 'Version 1 (test).', confirm: true },
        { cookie: admin },
      ),
    );
    expect(made.status, JSON.stringify(made.body)).toBe(201);
    const evaluateOnB = () => apiAt(serverB, '/api/evaluations', postJson({ jurisdiction: slug, plan: hallClosetPassPlan, findings: 'failing' }, { cookie: installer }));
    const first = await evaluateOnB();
    expect(first.status, JSON.stringify(first.body)).toBe(200);
    expect(first.body.ruleSet.version).toBe(1);
    expect((await evaluateOnB()).body.ruleSet.version).toBe(1);

    const draft = await api(`/api/jurisdictions/${slug}/rule-sets`, postJson({ from: 'published' }, { cookie: admin }));
    expect(draft.status, JSON.stringify(draft.body)).toBe(201);
    const published = await api(`/api/rule-sets/${draft.body.id}/publish`, postJson({ revision: draft.body.revision, changelog: 'Version 2 (test): republished.', confirm: true }, { cookie: admin }));
    expect(published.status, JSON.stringify(published.body)).toBe(200);
    const seen = await until('server B evaluating under version 2', async () => {
      const res = await evaluateOnB();
      return res.body.ruleSet?.version === 2 ? res : null;
    }, 1_000, 20);
    expect(seen.ms).toBeLessThan(1_000);
  });

  it('counts a shared limit across both servers: 60 report look-ups a minute from one address, wherever they land', { timeout: 60_000 }, async () => {
    const client = `198.51.100.${Math.floor(Math.random() * 200) + 20}`;
    const headers = { 'x-forwarded-for': client };
    // A code no report has: each look-up counts (lib/services/reports/limits.ts REPORT_LOOKUP_LIMIT, 60 a minute).
    const statuses: number[] = [];
    for (let i = 0; i < 60; i += 10) {
      const batch = Array.from({ length: 10 }, (_, j) => ((i + j) % 2 === 0 ? api : (p: string, init: RequestInit) => apiAt(serverB, p, init))('/api/reports/NP-2222-2222-2222-2222', { headers }));
      statuses.push(...(await Promise.all(batch)).map((r) => r.status));
    }
    expect(statuses.filter((s) => s === 404)).toHaveLength(60);
    expect((await apiAt(serverB, '/api/reports/NP-2222-2222-2222-2222', { headers })).status).toBe(429);
    expect((await api('/api/reports/NP-2222-2222-2222-2222', { headers })).status).toBe(429);
  });

  it('serves the same build: both answer the same plan schema', async () => {
    const a = await api('/api/schema/plan');
    const b = await apiAt(serverB, '/api/schema/plan');
    expect(b.status).toBe(200);
    expect(b.body).toEqual(a.body);
    expect(baseUrl).not.toBe(serverB);
  });

  it('an e-mail queued by one server is delivered once with both servers working the queue, even when its job is queued twice', { timeout: 90_000 }, async () => {
    // Both servers run the job workers (instrumentation.ts); B's own log says so.
    await until('the second server’s workers', async () => (output.includes('job workers started') ? true : null), 30_000, 250);
    const db = appDb();
    const tag = randomBytes(4).toString('hex');
    const org = await db.insertInto('organizations').values({ name: `IT two-server mail ${tag} (test)` }).returning('id').executeTakeFirstOrThrow();
    const ownerEmail = `it-owner-${tag}@example.test`;
    await db.insertInto('users').values({ email: ownerEmail, name: `Owner ${tag}`, role: 'installer', is_owner: true, organization_id: org.id, password_hash: await bcrypt.hash(`pw-${tag}`, 4) }).execute();
    const cookie = await signIn(ownerEmail, `pw-${tag}`);

    // Six invitations, three through each server; each answers at once with its e-mail queued.
    const invitees = Array.from({ length: 6 }, (_, i) => `it-two-${tag}-${i}@example.test`);
    const mailIds: string[] = [];
    for (const [i, email] of invitees.entries()) {
      const res = await apiAt(i % 2 ? serverB : baseUrl, '/api/invitations', postJson({ email, role: 'installer' }, { cookie, headers: { 'x-forwarded-for': testAddress() } }));
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(res.body.mail.status).toBe('queued');
      mailIds.push(res.body.mail.id);
    }
    // A second job for every message, as a crash between commit and enqueue followed by the periodic pass would make.
    const boss = new PgBoss({ connectionString: appDatabaseUrl(), schema: 'pgboss', supervise: false, schedule: false, migrate: false });
    boss.on('error', () => undefined);
    await boss.start();
    try {
      for (const outboxId of mailIds) expect(await boss.send('mail-deliver', { outboxId })).toBeTruthy();
      // Every job, first and second, is finished by one of the servers.
      await until(
        'every delivery job finished',
        async () => {
          const open = await sql<{ n: number }>`SELECT count(*)::int AS n FROM pgboss.job WHERE name = 'mail-deliver' AND state < 'completed' AND data->>'outboxId' = ANY(${mailIds})`.execute(db);
          return open.rows[0].n === 0 ? true : null;
        },
        60_000,
        250,
      );
    } finally {
      await boss.stop({ graceful: false, wait: true });
    }
    const inbox = await inboxMessages();
    for (const email of invitees) expect(inbox.filter((m) => m.to.toLowerCase().includes(email)), email).toHaveLength(1);
    const rows = await db.selectFrom('mail_outbox').select(['status', 'attempts']).where('id', 'in', mailIds).execute();
    expect(rows).toHaveLength(6);
    for (const r of rows) expect(r).toEqual({ status: 'sent', attempts: 1 });
    await db.destroy();
  });
});
