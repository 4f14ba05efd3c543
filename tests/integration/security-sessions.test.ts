import { randomBytes } from 'node:crypto';
import bcrypt from 'bcryptjs';
import { sql } from 'kysely';
import { afterAll, describe, expect, it } from 'vitest';
import { api, appDb, baseUrl, postJson, signIn, signOut, testAddress } from './helpers';

const db = appDb();
afterAll(async () => {
  await db.destroy();
});

const PASSWORD = 'session-test-pw-1';

async function freshUser(prefix: string): Promise<{ email: string; id: string }> {
  const email = `${prefix}-${randomBytes(4).toString('hex')}@example.test`;
  const org = await db.selectFrom('organizations').select('id').where('name', '=', 'Demo Closet Works').executeTakeFirstOrThrow();
  const row = await db
    .insertInto('users')
    .values({ email, name: 'Session Test', role: 'installer', organization_id: org.id, password_hash: bcrypt.hashSync(PASSWORD, 4) })
    .returning('id')
    .executeTakeFirstOrThrow();
  return { email, id: row.id };
}

const newProject = { name: 'After sign-out (test)', siteAddress: '1 Session Way', jurisdiction: 'demo-county' };

async function sessionBody(cookie: string) {
  const res = await fetch(`${baseUrl}/api/auth/session`, { headers: { cookie } });
  return { body: (await res.json()) as Record<string, unknown>, setCookies: res.headers.getSetCookie() };
}

async function pageTarget(path: string, cookie: string): Promise<string> {
  const res = await fetch(`${baseUrl}${path}`, { headers: { cookie }, redirect: 'manual' });
  const html = await res.text();
  const inPage = html.match(/<meta id="__next-page-redirect" http-equiv="refresh" content="\d+;url=([^"]+)"/)?.[1];
  const location = [302, 303, 307, 308].includes(res.status) ? res.headers.get('location') : inPage;
  return location ? new URL(location.replace(/&amp;/g, '&'), baseUrl).pathname : `${res.status}`;
}

describe('signing out ends the session everywhere', () => {
  it('a copied cookie is refused after sign-out: 401 on /api/me and POST /api/projects, no session, no page', async () => {
    const { email } = await freshUser('signout');
    const cookie = await signIn(email, PASSWORD, { address: testAddress() });
    const copy = cookie;
    expect((await api('/api/me', { cookie: copy })).status).toBe(200);

    expect(await signOut(cookie)).toBeLessThan(400);

    const me = await api('/api/me', { cookie: copy });
    expect(me.status).toBe(401);
    expect((await api('/api/projects', postJson(newProject, { cookie: copy }))).status).toBe(401);
    const session = await sessionBody(copy);
    expect(session.body).toEqual({});
    // No fresh cookie handed back; only the clearing one.
    expect(session.setCookies.filter((c) => /session-token=[^;]/.test(c))).toEqual([]);
    expect(await pageTarget('/account', copy)).toBe('/sign-in');
  });

  it('records each sign-in as a session with its browser and address, and revokes it on sign-out', async () => {
    const { email, id } = await freshUser('session-row');
    const address = testAddress();
    const cookie = await signIn(email, PASSWORD, { address });
    const rows = await db.selectFrom('sessions').selectAll().where('user_id', '=', id).execute();
    expect(rows).toHaveLength(1);
    expect(rows[0].client_address).toBe(address);
    expect(rows[0].revoked_at).toBeNull();
    await signOut(cookie);
    const after = await db.selectFrom('sessions').select('revoked_at').where('id', '=', rows[0].id).executeTakeFirstOrThrow();
    expect(after.revoked_at).not.toBeNull();
  });
});

describe('a session has an absolute lifetime', () => {
  it('reading the session neither re-issues the cookie nor moves its expiry; it ends seven days after sign-in', async () => {
    const { email, id } = await freshUser('lifetime');
    const cookie = await signIn(email, PASSWORD, { address: testAddress() });
    const row = await db.selectFrom('sessions').select(['expires_at', 'created_at']).where('user_id', '=', id).executeTakeFirstOrThrow();
    // Absolute timeout (OWASP Session Management Cheat Sheet); seven days is our choice.
    expect(new Date(row.expires_at).getTime() - new Date(row.created_at).getTime()).toBe(7 * 24 * 3600_000);
    const first = await sessionBody(cookie);
    await new Promise((r) => setTimeout(r, 1100));
    const second = await sessionBody(cookie);
    expect(first.body.expires).toBe(new Date(Math.floor(new Date(row.expires_at).getTime() / 1000) * 1000).toISOString());
    expect(second.body.expires).toBe(first.body.expires);
    expect(first.setCookies.filter((c) => /session-token=[^;]/.test(c))).toEqual([]);
    expect(second.setCookies.filter((c) => /session-token=[^;]/.test(c))).toEqual([]);
  });

  it('an expired session row is refused: 401, no session, sign-in page', async () => {
    const { email, id } = await freshUser('expired');
    const cookie = await signIn(email, PASSWORD, { address: testAddress() });
    expect((await api('/api/me', { cookie })).status).toBe(200);
    await db.updateTable('sessions').set({ expires_at: sql`created_at` }).where('user_id', '=', id).execute();
    expect((await api('/api/me', { cookie })).status).toBe(401);
    expect((await api('/api/projects', postJson(newProject, { cookie }))).status).toBe(401);
    expect((await sessionBody(cookie)).body).toEqual({});
    expect(await pageTarget('/projects', cookie)).toBe('/sign-in');
  });

  it('is kept absolute by the database: no later expiry, no un-revoking, no handing to another user', async () => {
    const { email, id } = await freshUser('guard');
    await signIn(email, PASSWORD, { address: testAddress() });
    const row = await db.selectFrom('sessions').selectAll().where('user_id', '=', id).executeTakeFirstOrThrow();
    await expect(db.updateTable('sessions').set({ expires_at: sql`expires_at + interval '1 day'` }).where('id', '=', row.id).execute()).rejects.toThrow(/earlier/);
    const other = await freshUser('guard-other');
    await expect(db.updateTable('sessions').set({ user_id: other.id }).where('id', '=', row.id).execute()).rejects.toThrow(/keeps its id/);
    await db.updateTable('sessions').set({ revoked_at: new Date() }).where('id', '=', row.id).execute();
    await expect(db.updateTable('sessions').set({ revoked_at: null }).where('id', '=', row.id).execute()).rejects.toThrow(/stays revoked/);
  });
});

describe('sign out everywhere else', () => {
  it('ends the other sessions and keeps this one; an API token may not do it', async () => {
    const { email } = await freshUser('everywhere');
    const here = await signIn(email, PASSWORD, { address: testAddress() });
    const laptop = await signIn(email, PASSWORD, { address: testAddress() });
    const phone = await signIn(email, PASSWORD, { address: testAddress() });
    const res = await api('/api/sessions/revoke-others', { method: 'POST', cookie: here });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ revoked: 2 });
    expect((await api('/api/me', { cookie: here })).status).toBe(200);
    expect((await api('/api/me', { cookie: laptop })).status).toBe(401);
    expect((await api('/api/me', { cookie: phone })).status).toBe(401);

    const token = await api('/api/tokens', postJson({ name: 'not for sessions' }, { cookie: here }));
    const byToken = await api('/api/sessions/revoke-others', { method: 'POST', token: token.body.token });
    expect(byToken.status).toBe(403);
    expect(byToken.body.error).toMatch(/API token cannot/);
    expect((await api('/api/me', { cookie: here })).status).toBe(200);
  });

  it('lists the account page sessions with this browser marked', async () => {
    const { email } = await freshUser('listing');
    const here = await signIn(email, PASSWORD, { address: testAddress() });
    await signIn(email, PASSWORD, { address: testAddress() });
    const html = await (await fetch(`${baseUrl}/account`, { headers: { cookie: here } })).text();
    expect(html).toContain('Where you are signed in');
    expect(html.match(/This browser/g)?.length).toBeGreaterThanOrEqual(1);
    expect(html).toContain('Another browser');
    expect(html).toContain('Sign out everywhere else');
  });
});
