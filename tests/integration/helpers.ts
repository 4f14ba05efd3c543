import { randomBytes } from 'node:crypto';
import { readdirSync, readFileSync, readlinkSync } from 'node:fs';
import { request as httpRequest } from 'node:http';
import bcrypt from 'bcryptjs';
import pg from 'pg';
import { createDb, type DB } from '@/db';

export const baseUrl = process.env.NOOKPASS_BASE_URL ?? 'http://127.0.0.1:3100';
export const demoPassword = process.env.NOOKPASS_DEMO_PASSWORD || 'demo-password';

function adminUrl(): string {
  const url = process.env.NOOKPASS_ADMIN_DATABASE_URL;
  if (!url) throw new Error('NOOKPASS_ADMIN_DATABASE_URL is not set: run the integration tests through npm test.');
  return url;
}

/**
 * A raw pg pool for tests that talk to PostgreSQL without Kysely (the rate limiter's store). pg's pool resolves
 * `end()` before its sockets have closed and keeps its idle listener on each client: a backend ended while a test
 * database is dropped then arrives as an 'error' event on the pool, which without a listener is an uncaught
 * exception in the test process. Expected at teardown, so it is listened for here.
 */
export function testPool(connectionString: string, max: number): pg.Pool {
  const pool = new pg.Pool({ connectionString, max });
  pool.on('error', () => undefined);
  return pool;
}

/** Waits (up to `ms`) until no session is connected to the database `name`. */
async function untilNoSessions(admin: pg.Client, name: string, ms = 5_000): Promise<void> {
  const deadline = Date.now() + ms;
  while (Date.now() < deadline) {
    const { rows } = await admin.query<{ n: number }>('SELECT count(*)::int AS n FROM pg_stat_activity WHERE datname = $1', [name]);
    if (rows[0].n === 0) return;
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
}

/** A throwaway database in the private cluster, dropped by `drop()`. */
export async function createScratchDb(): Promise<{ db: DB; url: string; drop: () => Promise<void> }> {
  const name = `nookpass_it_${randomBytes(6).toString('hex')}`;
  const admin = new pg.Client({ connectionString: adminUrl() });
  await admin.connect();
  await admin.query(`CREATE DATABASE "${name}"`);
  await admin.end();
  const url = adminUrl().replace(/\/[^/]*$/, `/${name}`);
  const db = createDb(url, 2);
  return {
    db,
    url,
    drop: async () => {
      await db.destroy();
      const c = new pg.Client({ connectionString: adminUrl() });
      await c.connect();
      // Closed pools finish disconnecting in the background; dropping under them would end their sessions with
      // an error. FORCE stays for a session a test left open.
      await untilNoSessions(c, name);
      await c.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
      await c.end();
    },
  };
}

/** Retries `attempt` until it gives a value (not null) or `ms` pass: for what the app learns of a moment after it happens. */
export async function until<T>(what: string, attempt: () => Promise<T | null>, ms: number, every = 50): Promise<{ value: T; ms: number }> {
  const start = Date.now();
  for (;;) {
    const value = await attempt();
    if (value !== null) return { value, ms: Date.now() - start };
    if (Date.now() - start > ms) throw new Error(`${what}: not within ${ms} ms`);
    await new Promise((resolve) => setTimeout(resolve, every));
  }
}

/**
 * Switches off people a test made, keeping their records: Demo City has no inspector of its own in the demo,
 * and the tests that say so must find it that way whatever ran before them.
 */
export async function deactivateTestPeople(db: DB, ...emails: string[]): Promise<void> {
  await db.updateTable('users').set({ deactivated_at: new Date() }).where('email', 'in', emails).execute();
}

/** The database the served app uses (already migrated and seeded by npm test). */
export function appDb(): DB {
  return createDb(appDatabaseUrl(), 2);
}

export function appDatabaseUrl(): string {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error('DATABASE_URL is not set: run the integration tests through npm test.');
  return url;
}

export type SignInAttempt = {
  status: number;
  /** next-auth's error code from the answer's URL (CredentialsSignin, throttled, …), or null on success. */
  error: string | null;
  /** Where next-auth says to go next. */
  url: string | null;
  /** Cookie header with the session cookie when the sign-in succeeded. */
  cookie: string | null;
  retryAfter: string | null;
  /** The `error` text of a refusal that carries one (a throttled sign-in). */
  message: string | null;
  ms: number;
};

/**
 * One sign-in through next-auth's credentials flow, as the sign-in form sends it. `address` is sent as
 * X-Forwarded-For, which the app reads as the client address (the nearest proxy's entry), so a test can
 * stand for another machine; without it the loopback address counts.
 */
export async function attemptSignIn(email: string, password: string, opts: { address?: string; callbackUrl?: string } = {}): Promise<SignInAttempt> {
  const jar = new Map<string, string>();
  const keep = (res: Response) => {
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';');
      const i = pair.indexOf('=');
      jar.set(pair.slice(0, i), pair.slice(i + 1));
    }
  };
  const cookie = () => [...jar].map(([k, v]) => `${k}=${v}`).join('; ');
  const forwarded: Record<string, string> = opts.address ? { 'x-forwarded-for': opts.address } : {};
  const csrfRes = await fetch(`${baseUrl}/api/auth/csrf`, { headers: forwarded });
  keep(csrfRes);
  const { csrfToken } = (await csrfRes.json()) as { csrfToken: string };
  const body = new URLSearchParams({ csrfToken, email, password, json: 'true' });
  if (opts.callbackUrl !== undefined) body.set('callbackUrl', opts.callbackUrl);
  const started = performance.now();
  const res = await fetch(`${baseUrl}/api/auth/callback/credentials`, {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded', cookie: cookie(), ...forwarded },
    body,
  });
  const text = await res.text();
  const ms = performance.now() - started;
  keep(res);
  let url: string | null = null;
  let message: string | null = null;
  try {
    const parsed = JSON.parse(text) as { url?: string; error?: string };
    url = parsed.url ?? null;
    message = parsed.error ?? null;
  } catch {
    url = res.headers.get('location');
  }
  const sessionCookie = [...jar].find(([k]) => k.endsWith('next-auth.session-token'));
  const signedIn = !!sessionCookie?.[1];
  return {
    status: res.status,
    error: url ? new URL(url, baseUrl).searchParams.get('error') : null,
    url,
    cookie: signedIn ? cookie() : null,
    retryAfter: res.headers.get('retry-after'),
    message,
    ms,
  };
}

/** Signs in through next-auth's credentials flow and returns the session cookie header. */
export async function signIn(email: string, password = demoPassword, opts: { address?: string } = {}): Promise<string> {
  const res = await attemptSignIn(email, password, opts);
  if (!res.cookie) throw new Error(`sign-in failed for ${email}: ${res.status} ${res.error ?? ''}`);
  return res.cookie;
}

/** A fresh client address from the IPv6 documentation prefix (RFC 3849), so no two tests share counters. */
export function testAddress(): string {
  const h = randomBytes(8).toString('hex').match(/.{4}/g)!;
  return `2001:db8:${h.slice(0, 2).join(':')}::${h.slice(2).join(':')}`;
}

export function api(path: string, init: RequestInit & { cookie?: string; token?: string } = {}) {
  return apiAt(baseUrl, path, init);
}

/** `api` against another app server (the two-server test). */
export async function apiAt(base: string, path: string, init: RequestInit & { cookie?: string; token?: string } = {}) {
  const headers = new Headers(init.headers);
  if (init.cookie) headers.set('cookie', init.cookie);
  if (init.token) headers.set('authorization', `Bearer ${init.token}`);
  const res = await fetch(`${base}${path}`, { ...init, headers, redirect: 'manual' });
  const text = await res.text();
  let body: any = text;
  try {
    body = JSON.parse(text);
  } catch {
    /* not JSON */
  }
  return { status: res.status, body, headers: res.headers };
}

/** Signs out the way the sign-out page does (next-auth's signout with its CSRF token). */
export async function signOut(cookie: string, base = baseUrl): Promise<number> {
  const csrf = await fetch(`${base}/api/auth/csrf`, { headers: { cookie } });
  const { csrfToken } = (await csrf.json()) as { csrfToken: string };
  const csrfCookie = csrf.headers.getSetCookie().map((c) => c.split(';')[0]);
  const res = await fetch(`${base}/api/auth/signout`, {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded', cookie: [cookie, ...csrfCookie].join('; ') },
    body: new URLSearchParams({ csrfToken, callbackUrl: '/sign-in', json: 'true' }),
  });
  await res.arrayBuffer();
  return res.status;
}

export function postJson(body: unknown, extra: RequestInit & { cookie?: string; token?: string } = {}) {
  return { ...extra, method: extra.method ?? 'POST', headers: { 'content-type': 'application/json', ...(extra.headers ?? {}) }, body: JSON.stringify(body) };
}

/**
 * The process serving `baseUrl`, found the way `ss -ltnp` does it: the listening socket's inode in
 * /proc/net/tcp{,6}, then the process holding that inode among its file descriptors (Linux, same user).
 * A test-only window on the server's memory; null when the app is not a local process we can see.
 */
export function appServerPid(): number | null {
  const port = Number(new URL(baseUrl).port || 80);
  const inodes = new Set<string>();
  for (const table of ['/proc/net/tcp', '/proc/net/tcp6']) {
    let text = '';
    try {
      text = readFileSync(table, 'utf8');
    } catch {
      continue;
    }
    for (const line of text.split('\n').slice(1)) {
      const cols = line.trim().split(/\s+/);
      // st 0A is TCP_LISTEN (include/net/tcp_states.h); inode is the tenth column.
      if (cols.length >= 10 && cols[3] === '0A' && parseInt(cols[1].split(':').pop()!, 16) === port) inodes.add(cols[9]);
    }
  }
  for (const pid of readdirSync('/proc').filter((d) => /^\d+$/.test(d))) {
    let fds: string[];
    try {
      fds = readdirSync(`/proc/${pid}/fd`);
    } catch {
      continue;
    }
    for (const fd of fds) {
      try {
        const inode = readlinkSync(`/proc/${pid}/fd/${fd}`).match(/^socket:\[(\d+)\]$/)?.[1];
        if (inode && inodes.has(inode)) return Number(pid);
      } catch {
        /* closed meanwhile */
      }
    }
  }
  return null;
}

/** Resident set size of a process in MiB, from /proc/<pid>/status (VmRSS, in kB: proc(5)). */
export function rssMiB(pid: number): number {
  return Number(readFileSync(`/proc/${pid}/status`, 'utf8').match(/VmRSS:\s+(\d+)\s+kB/)![1]) / 1024;
}

/**
 * Sends `prefix`, then 64 KiB chunks with Transfer-Encoding: chunked and no Content-Length, until the
 * server answers or `pauseAfterBytes` are out; then it stops writing, leaves the body open and waits up to
 * 30 s for the answer. A server that waits for the end of the body therefore never answers, and the upload
 * fails. Stopping short of an endless stream also means the client is not writing when a server that has
 * answered drops the connection, so that answer is read rather than lost to a write error (ECONNRESET).
 * Returns the status, what was sent, and — sampled every 20 ms from before the first byte until half a
 * second after the answer — how far the server's RSS rose.
 */
export async function chunkedUpload(opts: {
  method?: string;
  path: string;
  headers?: Record<string, string>;
  prefix?: Buffer | string;
  /** Where the client stops writing: a little past the route's limit. */
  pauseAfterBytes: number;
  fill?: number;
}): Promise<{ status: number; sentBytes: number; rssGrowthMiB: number | null; ms: number }> {
  const pid = appServerPid();
  const baseline = pid ? rssMiB(pid) : 0;
  let peak = baseline;
  const sample = () => {
    if (pid) peak = Math.max(peak, rssMiB(pid));
  };
  const timer = setInterval(sample, 20);
  const started = Date.now();
  const chunk = Buffer.alloc(64 * 1024, opts.fill ?? 0x20);
  try {
    const { status, sentBytes } = await new Promise<{ status: number; sentBytes: number }>((resolve, reject) => {
      let sent = 0;
      let answered = false;
      const req = httpRequest(new URL(opts.path, baseUrl), { method: opts.method ?? 'POST', headers: { ...opts.headers, 'transfer-encoding': 'chunked' } }, (res) => {
        answered = true;
        res.resume();
        resolve({ status: res.statusCode ?? 0, sentBytes: sent });
        req.destroy(); // the rest of the upload is not wanted, by either side
      });
      let silence: NodeJS.Timeout | undefined;
      req.on('response', () => clearTimeout(silence));
      req.on('error', (err) => {
        if (answered) return;
        clearTimeout(silence);
        reject(err);
      });
      if (opts.prefix) req.write(opts.prefix);
      const pump = () => {
        while (!answered && sent < opts.pauseAfterBytes) {
          sent += chunk.length;
          if (!req.write(chunk)) return void req.once('drain', pump);
        }
        if (answered) return;
        silence = setTimeout(() => {
          req.destroy();
          reject(new Error(`No answer within 30 s of the last of ${sent} bytes, the body still open: the server waits for its end.`));
        }, 30_000);
      };
      pump();
    });
    const ms = Date.now() - started;
    await new Promise((r) => setTimeout(r, 500));
    sample();
    return { status, sentBytes, rssGrowthMiB: pid ? peak - baseline : null, ms };
  } finally {
    clearInterval(timer);
  }
}

/**
 * A company of its own with one installer, signed in: tests that send reports count against that company's
 * hourly send limit instead of the demo company's, which other test files share.
 */
export async function newInstallerCompany(db: DB, label: string): Promise<{ cookie: string; organizationId: string; organizationName: string; email: string }> {
  const tag = randomBytes(4).toString('hex');
  const organizationName = `IT ${label} ${tag} (test)`;
  const org = await db.insertInto('organizations').values({ name: organizationName }).returning('id').executeTakeFirstOrThrow();
  const email = `it-${tag}@example.test`;
  const password = `it-pw-${tag}`;
  await db.insertInto('users').values({ email, name: `Installer ${tag}`, role: 'installer', organization_id: org.id, password_hash: await bcrypt.hash(password, 4) }).execute();
  return { cookie: await signIn(email, password), organizationId: org.id, organizationName, email };
}

/** A message in the fake relay's inbox (lib/platform/fakes). */
export type InboxMessage = { id: string; to: string; replyTo?: string; subject: string; text: string; attachments: { filename: string; contentType: string; size: number }[] };

export const inboxUrl = () => process.env.NOOKPASS_INBOX_URL ?? 'http://127.0.0.1:54326';

export async function inboxMessages(): Promise<InboxMessage[]> {
  return (await (await fetch(`${inboxUrl()}/api/messages`)).json()) as InboxMessage[];
}

/**
 * E-mails leave through the outbox: a job delivers them a moment after the request that queued them. Polls the
 * inbox until `count` messages match (default one), up to `ms`; returns the matches, oldest first.
 */
export async function waitForMail(match: (m: InboxMessage) => boolean, opts: { ms?: number; count?: number } = {}): Promise<InboxMessage[]> {
  const deadline = Date.now() + (opts.ms ?? 30_000);
  const count = opts.count ?? 1;
  let found: InboxMessage[] = [];
  while (Date.now() < deadline) {
    found = (await inboxMessages()).filter(match).sort((a, b) => a.id.localeCompare(b.id));
    if (found.length >= count) return found;
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`waited ${opts.ms ?? 30_000} ms for ${count} message(s), found ${found.length}`);
}

/** Polls an e-mail's delivery state (GET /api/mail/<id>) until `done` holds, up to `ms`; returns the last state. */
export async function waitForMailState(id: string, cookie: string, done: (s: { status: string; attempts: number }) => boolean, ms = 30_000, base = baseUrl) {
  const deadline = Date.now() + ms;
  let last: any = null;
  while (Date.now() < deadline) {
    const res = await apiAt(base, `/api/mail/${id}`, { cookie });
    if (res.status !== 200) throw new Error(`GET /api/mail/${id} answered ${res.status}`);
    last = res.body;
    if (done(last)) return last as { status: string; attempts: number; maxAttempts: number; lastError: string | null; label: string };
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`mail ${id} still ${last?.status} after ${ms} ms`);
}

export type ThumbnailStateBody = { id: string; status: string; attempts: number; maxAttempts: number; lastError: string | null; label: string; canMakeAgain: boolean };

/**
 * A photo's thumbnail and report-size image are made by a job after the upload answers. Polls
 * GET /api/attachments/<id>/derivatives until `done` holds (by default: ready or failed), up to `ms`.
 */
export async function waitForThumbnail(id: string, cookie: string, done: (s: ThumbnailStateBody) => boolean = (s) => s.status === 'ready' || s.status === 'failed', ms = 60_000): Promise<ThumbnailStateBody> {
  const deadline = Date.now() + ms;
  let last: ThumbnailStateBody | null = null;
  while (Date.now() < deadline) {
    const res = await api(`/api/attachments/${id}/derivatives`, { cookie });
    if (res.status !== 200) throw new Error(`GET /api/attachments/${id}/derivatives answered ${res.status}`);
    last = res.body as ThumbnailStateBody;
    if (done(last)) return last;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`attachment ${id} thumbnail still ${last?.status} after ${ms} ms`);
}
