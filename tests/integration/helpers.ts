import { randomBytes } from 'node:crypto';
import pg from 'pg';
import { createDb, type DB } from '@/db';

export const baseUrl = process.env.NOOKPASS_BASE_URL ?? 'http://127.0.0.1:3100';
export const demoPassword = process.env.NOOKPASS_DEMO_PASSWORD || 'demo-password';

function adminUrl(): string {
  const url = process.env.NOOKPASS_ADMIN_DATABASE_URL;
  if (!url) throw new Error('NOOKPASS_ADMIN_DATABASE_URL is not set: run the integration tests through npm test.');
  return url;
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
      await c.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
      await c.end();
    },
  };
}

/** The database the served app uses (already migrated and seeded by npm test). */
export function appDb(): DB {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error('DATABASE_URL is not set: run the integration tests through npm test.');
  return createDb(url, 2);
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

export async function api(path: string, init: RequestInit & { cookie?: string; token?: string } = {}) {
  const headers = new Headers(init.headers);
  if (init.cookie) headers.set('cookie', init.cookie);
  if (init.token) headers.set('authorization', `Bearer ${init.token}`);
  const res = await fetch(`${baseUrl}${path}`, { ...init, headers, redirect: 'manual' });
  const text = await res.text();
  let body: any = text;
  try {
    body = JSON.parse(text);
  } catch {
    /* not JSON */
  }
  return { status: res.status, body, headers: res.headers };
}

export function postJson(body: unknown, extra: RequestInit & { cookie?: string; token?: string } = {}) {
  return { ...extra, method: extra.method ?? 'POST', headers: { 'content-type': 'application/json', ...(extra.headers ?? {}) }, body: JSON.stringify(body) };
}
