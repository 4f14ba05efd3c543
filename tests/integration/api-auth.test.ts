import bcrypt from 'bcryptjs';
import { afterAll, describe, expect, it } from 'vitest';
import { api, appDb, attemptSignIn, postJson, signIn, testAddress } from './helpers';

const db = appDb();
afterAll(async () => {
  await db.destroy();
});

describe('health and public routes', () => {
  it('reports the database', async () => {
    const res = await api('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ ok: true, db: 'up' });
  });
});

describe('protected routes', () => {
  it('answer 401 to an anonymous caller', async () => {
    for (const path of ['/api/me', '/api/users', '/api/tokens', '/api/jurisdictions']) {
      const res = await api(path);
      expect(res.status, path).toBe(401);
      expect(res.body.error).toMatch(/sign in/i);
    }
  });

  it('answer 403 to the wrong role and 200 to the right one', async () => {
    const installer = await signIn('installer@nookpass.demo');
    const inspector = await signIn('inspector@nookpass.demo');
    const admin = await signIn('admin@nookpass.demo');
    expect((await api('/api/users', { cookie: installer })).status).toBe(403);
    expect((await api('/api/users', { cookie: inspector })).status).toBe(403);
    const ok = await api('/api/users', { cookie: admin });
    expect(ok.status).toBe(200);
    expect(ok.body.users.length).toBeGreaterThanOrEqual(5);
    expect(JSON.stringify(ok.body)).not.toMatch(/password/i);
  });

  it('list jurisdictions with their adopted editions', async () => {
    const cookie = await signIn('installer@nookpass.demo');
    const res = await api('/api/jurisdictions', { cookie });
    expect(res.status).toBe(200);
    const county = res.body.find((j: { slug: string }) => j.slug === 'demo-county');
    expect(county.editions).toMatchObject({ building: 'IRC 2018', electrical: 'NEC 2017', plumbing: 'IPC 2018' });
    expect(county).toHaveProperty('publishedVersion');
  });
});

describe('bad input', () => {
  it('gets 400 for malformed JSON or a wrong content type, never a 500', async () => {
    const cookie = await signIn('installer2@nookpass.demo');
    const malformed = await api('/api/tokens', { method: 'POST', cookie, headers: { 'content-type': 'application/json' }, body: '{"name": ' });
    expect(malformed.status).toBe(400);
    expect(malformed.body.errors[0].message).toMatch(/not valid JSON/);
    const wrongType = await api('/api/tokens', { method: 'POST', cookie, headers: { 'content-type': 'text/plain' }, body: 'name=x' });
    expect(wrongType.status).toBe(400);
    expect(wrongType.body.errors[0].message).toMatch(/Content-Type/);
    const missing = await api('/api/tokens', postJson({}, { cookie }));
    expect(missing.status).toBe(400);
    expect(missing.body.errors[0].path).toBe('name');
    const unknown = await api('/api/tokens', postJson({ name: 'x', admin: true }, { cookie }));
    expect(unknown.status).toBe(400);
  });

  it('refuses a cookie-authenticated write from another site', async () => {
    const cookie = await signIn('installer2@nookpass.demo');
    const res = await api('/api/tokens', postJson({ name: 'cross-site' }, { cookie, headers: { origin: 'https://evil.example' } }));
    expect(res.status).toBe(403);
  });
});

describe('personal API tokens', () => {
  it('work as Bearer tokens until revoked, and are stored hashed', async () => {
    const cookie = await signIn('installer@nookpass.demo');
    const created = await api('/api/tokens', postJson({ name: 'integration test' }, { cookie }));
    expect(created.status).toBe(201);
    const token: string = created.body.token;
    expect(token).toMatch(/^np_/);

    const stored = await db.selectFrom('api_tokens').selectAll().where('id', '=', created.body.id).executeTakeFirstOrThrow();
    expect(stored.token_hash).not.toContain(token.slice(3));
    expect(stored.token_hash).toHaveLength(64);

    const me = await api('/api/me', { token });
    expect(me.status).toBe(200);
    expect(me.body.user.email).toBe('installer@nookpass.demo');
    const touched = await db.selectFrom('api_tokens').select('last_used_at').where('id', '=', created.body.id).executeTakeFirstOrThrow();
    expect(touched.last_used_at).not.toBeNull();

    // The token carries the user's role: an installer token cannot reach admin routes.
    expect((await api('/api/users', { token })).status).toBe(403);

    // The list never shows the token itself again.
    const list = await api('/api/tokens', { cookie });
    expect(JSON.stringify(list.body)).not.toContain(token);

    const revoked = await api(`/api/tokens/${created.body.id}`, { method: 'DELETE', cookie });
    expect(revoked.status).toBe(200);
    const after = await api('/api/me', { token });
    expect(after.status).toBe(401);
    expect(after.body.error).toMatch(/revoked/);

    const audit = await db.selectFrom('audit_log').select('action').where('entity_id', '=', created.body.id).orderBy('id').execute();
    expect(audit.map((a) => a.action)).toEqual(['api-token.create', 'api-token.revoke']);
  });

  it('cannot be revoked by another user', async () => {
    const owner = await signIn('installer@nookpass.demo');
    const other = await signIn('other-installer@nookpass.demo');
    const created = await api('/api/tokens', postJson({ name: 'not yours' }, { cookie: owner }));
    expect((await api(`/api/tokens/${created.body.id}`, { method: 'DELETE', cookie: other })).status).toBe(404);
    expect((await api('/api/me', { token: created.body.token })).status).toBe(200);
  });

  it('refuses made-up tokens', async () => {
    expect((await api('/api/me', { token: 'np_' + 'A'.repeat(43) })).status).toBe(401);
    expect((await api('/api/me', { token: 'garbage' })).status).toBe(401);
  });
});

describe('sign-in throttling', () => {
  it('locks an e-mail from one address after repeated failures, even for the right password, and says the same for unknown e-mails', async () => {
    const email = `throttle-${Date.now()}@example.test`;
    const org = await db.selectFrom('organizations').select('id').where('name', '=', 'Demo Closet Works').executeTakeFirstOrThrow();
    await db
      .insertInto('users')
      .values({ email, name: 'Throttle Test', role: 'installer', organization_id: org.id, password_hash: await bcrypt.hash('right-password-1', 4) })
      .execute();

    // One client address for the whole story, so the address counters of other tests never mix in.
    const address = testAddress();
    const attempt = async (who: string, password: string) => (await attemptSignIn(who, password, { address })).error;

    expect(await attempt('nobody-here@example.test', 'whatever-pass')).toBe('CredentialsSignin');
    for (let i = 0; i < 5; i++) expect(await attempt(email, 'wrong-password')).toBe('CredentialsSignin');
    expect(await attempt(email, 'right-password-1')).toBe('throttled');
    // The lock holds for this e-mail from that address only: the owner elsewhere still gets in.
    expect((await attemptSignIn(email, 'right-password-1', { address: testAddress() })).cookie).not.toBeNull();
  });
});
