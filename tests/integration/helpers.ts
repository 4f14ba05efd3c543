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

/** Signs in through next-auth's credentials flow and returns the session cookie header. */
export async function signIn(email: string, password = demoPassword): Promise<string> {
  const jar = new Map<string, string>();
  const keep = (res: Response) => {
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';');
      const i = pair.indexOf('=');
      jar.set(pair.slice(0, i), pair.slice(i + 1));
    }
  };
  const cookie = () => [...jar].map(([k, v]) => `${k}=${v}`).join('; ');
  const csrfRes = await fetch(`${baseUrl}/api/auth/csrf`);
  keep(csrfRes);
  const { csrfToken } = (await csrfRes.json()) as { csrfToken: string };
  const res = await fetch(`${baseUrl}/api/auth/callback/credentials`, {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded', cookie: cookie() },
    body: new URLSearchParams({ csrfToken, email, password, json: 'true' }),
  });
  keep(res);
  if (![...jar.keys()].some((k) => k.endsWith('next-auth.session-token'))) {
    throw new Error(`sign-in failed for ${email}: ${res.status} ${await res.text()}`);
  }
  return cookie();
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
