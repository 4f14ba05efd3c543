import { randomBytes } from 'node:crypto';
import bcrypt from 'bcryptjs';
import { sql } from 'kysely';
import { afterAll, describe, expect, it } from 'vitest';
import { createMigrator } from '@/db/migrator';
import { api, appDb, createScratchDb, postJson, signIn, testAddress, until } from './helpers';

const db = appDb();
afterAll(async () => {
  await db.destroy();
});

const PASSWORD = 'token-test-pw-1';
const DAY_MS = 24 * 3600_000;

/** A user of its own for each test, so the ten-an-hour limit of a shared account never interferes. */
async function freshUser(prefix: string): Promise<{ id: string; cookie: string }> {
  const email = `${prefix}-${randomBytes(4).toString('hex')}@example.test`;
  const org = await db.selectFrom('organizations').select('id').where('name', '=', 'Demo Closet Works').executeTakeFirstOrThrow();
  const row = await db
    .insertInto('users')
    .values({ email, name: 'Token Test', role: 'installer', organization_id: org.id, password_hash: bcrypt.hashSync(PASSWORD, 4) })
    .returning('id')
    .executeTakeFirstOrThrow();
  return { id: row.id, cookie: await signIn(email, PASSWORD, { address: testAddress() }) };
}

async function storedTokens(userId: string): Promise<number> {
  const row = await db.selectFrom('api_tokens').select(db.fn.countAll<number>().as('n')).where('user_id', '=', userId).executeTakeFirstOrThrow();
  return Number(row.n);
}

describe('the hourly token limit', () => {
  it('holds under concurrency: of 20 parallel creations exactly 10 succeed, the rest get 429 with Retry-After', { timeout: 60_000 }, async () => {
    const { id, cookie } = await freshUser('token-burst');
    const answers = await Promise.all(Array.from({ length: 20 }, (_, i) => api('/api/tokens', postJson({ name: `burst ${i}` }, { cookie }))));
    expect(answers.filter((a) => a.status === 201)).toHaveLength(10);
    const refused = answers.filter((a) => a.status === 429); // RFC 6585 section 4
    expect(refused).toHaveLength(10);
    for (const r of refused) {
      const wait = Number(r.headers.get('retry-after'));
      expect(wait).toBeGreaterThan(3500);
      expect(wait).toBeLessThanOrEqual(3600);
    }
    expect(await storedTokens(id)).toBe(10);
  });
});

describe('what an API token may do', () => {
  it('cannot create tokens (403, nothing stored), so no token outlives the revocation of the one that made it', async () => {
    const { id, cookie } = await freshUser('token-mint');
    const parent = await api('/api/tokens', postJson({ name: 'parent' }, { cookie }));
    expect(parent.status).toBe(201);
    const child = await api('/api/tokens', postJson({ name: 'child' }, { token: parent.body.token }));
    expect(child.status).toBe(403);
    expect(child.body.error).toBe('An API token cannot create API tokens. Sign in and create one on the Account page.');
    expect(await storedTokens(id)).toBe(1);
    // It still reads and works as before.
    expect((await api('/api/tokens', { token: parent.body.token })).status).toBe(200);
    expect((await api(`/api/tokens/${parent.body.id}`, { method: 'DELETE', cookie })).status).toBe(200);
    expect((await api('/api/me', { token: parent.body.token })).status).toBe(401);
  });
});

describe('token expiry', () => {
  it('defaults to 90 days, takes a chosen lifetime up to a year, and refuses others naming the field', async () => {
    const { cookie } = await freshUser('token-expiry');
    const byDefault = await api('/api/tokens', postJson({ name: 'default' }, { cookie }));
    expect(byDefault.status).toBe(201);
    expect(Date.parse(byDefault.body.expiresAt) - Date.parse(byDefault.body.createdAt)).toBeCloseTo(90 * DAY_MS, -4);
    const month = await api('/api/tokens', postJson({ name: 'month', expiresInDays: 30 }, { cookie }));
    expect(Date.parse(month.body.expiresAt) - Date.parse(month.body.createdAt)).toBeCloseTo(30 * DAY_MS, -4);
    const year = await api('/api/tokens', postJson({ name: 'year', expiresInDays: 365 }, { cookie }));
    expect(year.status).toBe(201);
    for (const bad of [0, 366, 3650, 1.5, '90', null]) {
      const res = await api('/api/tokens', postJson({ name: 'bad', expiresInDays: bad }, { cookie }));
      expect(res.status, String(bad)).toBe(400);
      expect(res.body.errors[0].path).toBe('expiresInDays');
    }
    const list = await api('/api/tokens', { cookie });
    expect(list.body.tokens.map((t: { name: string; isExpired: boolean }) => [t.name, t.isExpired])).toEqual([
      ['year', false],
      ['month', false],
      ['default', false],
    ]);
  });

  it('refuses an expired token with 401 saying it expired', async () => {
    const { cookie } = await freshUser('token-expired');
    const created = await api('/api/tokens', postJson({ name: 'short-lived' }, { cookie }));
    expect((await api('/api/me', { token: created.body.token })).status).toBe(200);
    await db.updateTable('api_tokens').set({ expires_at: sql`created_at + interval '1 millisecond'` }).where('id', '=', created.body.id).execute();
    // The app server keeps token holders in memory and hears of this change from the database a moment later.
    const { value: res } = await until('the expired token refused', async () => {
      const answer = await api('/api/me', { token: created.body.token });
      return answer.status === 200 ? null : answer;
    }, 1000, 25);
    expect(res.status).toBe(401);
    expect(res.body.error).toMatch(/^The API token expired on \d{4}-\d{2}-\d{2}\. Create a new one on the Account page\.$/);
    expect((await api('/api/evaluations', postJson({}, { token: created.body.token }))).status).toBe(401);
    const listed = await api('/api/tokens', { cookie });
    expect(listed.body.tokens[0].isExpired).toBe(true);
  });
});

describe('the expiry migration', () => {
  it('gives tokens made before it 90 days from the migration, so they keep working and none lives forever', async () => {
    const scratch = await createScratchDb();
    try {
      const migrator = createMigrator(scratch.db);
      const { error } = await migrator.migrateTo('2026-12-03T21-10-00_sessions');
      expect(error).toBeUndefined();
      const org = await scratch.db.insertInto('organizations').values({ name: 'Scratch Co' }).returning('id').executeTakeFirstOrThrow();
      const user = await scratch.db
        .insertInto('users')
        .values({ email: 'old-token@example.test', name: 'Old', role: 'installer', organization_id: org.id, password_hash: 'x' })
        .returning('id')
        .executeTakeFirstOrThrow();
      await sql`INSERT INTO api_tokens (user_id, name, token_hash, token_prefix, created_at)
                VALUES (${user.id}, 'old', 'h', 'np_old', now() - interval '400 days')`.execute(scratch.db);
      const up = await migrator.migrateTo('2026-12-03T21-20-00_api-token-expiry');
      expect(up.error).toBeUndefined();
      const row = await scratch.db.selectFrom('api_tokens').select(['expires_at']).executeTakeFirstOrThrow();
      expect(new Date(row.expires_at).getTime() - Date.now()).toBeGreaterThan(89 * DAY_MS);
      expect(new Date(row.expires_at).getTime() - Date.now()).toBeLessThanOrEqual(90 * DAY_MS);
      await expect(sql`INSERT INTO api_tokens (user_id, name, token_hash, token_prefix) VALUES (${user.id}, 'n', 'h2', 'np_n')`.execute(scratch.db)).rejects.toThrow(/null value/);
    } finally {
      await scratch.drop();
    }
  });
});
