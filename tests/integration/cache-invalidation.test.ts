import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { DB } from '@/db';
import { migrateToLatest } from '@/db/migrator';
import { invalidatedCache, isListening, startListening, stopListening, type CacheEvent } from '@/lib/platform/cache/invalidation';
import { createScratchDb } from './helpers';

let scratch: Awaited<ReturnType<typeof createScratchDb>>;
let db: DB;
const savedUrl = process.env.DATABASE_URL;

beforeAll(async () => {
  scratch = await createScratchDb();
  db = scratch.db;
  const { error } = await migrateToLatest(db);
  if (error) throw error;
  process.env.DATABASE_URL = scratch.url;
  await startListening();
});
afterAll(async () => {
  await stopListening();
  process.env.DATABASE_URL = savedUrl;
  await scratch?.drop();
});

async function until(condition: () => boolean, ms = 2_000): Promise<number> {
  const start = Date.now();
  while (!condition()) {
    if (Date.now() - start > ms) throw new Error(`not within ${ms} ms`);
    await new Promise((resolve) => setTimeout(resolve, 10));
  }
  return Date.now() - start;
}

async function newToken(): Promise<{ userId: string; tokenId: string; hash: string }> {
  const org = await db.insertInto('organizations').values({ name: `Cache test company ${Math.random().toString(36).slice(2)}` }).returning('id').executeTakeFirstOrThrow();
  const user = await db
    .insertInto('users')
    .values({ email: `cache-${Math.random().toString(36).slice(2)}@example.test`, name: 'Cache Tester', password_hash: 'x', role: 'installer', organization_id: org.id })
    .returning('id')
    .executeTakeFirstOrThrow();
  const hash = `hash-${Math.random().toString(36).slice(2)}`;
  const token = await db
    .insertInto('api_tokens')
    .values({ user_id: user.id, name: 't', token_hash: hash, token_prefix: 'np_test', expires_at: sql<Date>`now() + interval '1 day'` })
    .returning('id')
    .executeTakeFirstOrThrow();
  return { userId: user.id, tokenId: token.id, hash };
}

describe('memory copies dropped by database announcements', () => {
  it('a revoked token is dropped from every cache within a second; a last-used update drops nothing', async () => {
    expect(isListening()).toBe(true);
    const seen: CacheEvent[] = [];
    const { tokenId, hash } = await newToken();
    let loads = 0;
    const cache = invalidatedCache<{ hash: string }>({
      max: 10,
      ttlMs: 60_000,
      affects: (event) => {
        seen.push(event);
        return event.kind === 'token' ? (event.ref ?? true) : false;
      },
    });
    const load = async () => {
      loads++;
      return { hash };
    };
    await cache.get(hash, load);
    await cache.get(hash, load);
    expect(loads).toBe(1);

    await db.updateTable('api_tokens').set({ last_used_at: new Date() }).where('id', '=', tokenId).execute();
    await new Promise((resolve) => setTimeout(resolve, 200));
    await cache.get(hash, load);
    expect(loads).toBe(1);
    expect(seen).toHaveLength(0);

    await db.updateTable('api_tokens').set({ revoked_at: new Date() }).where('id', '=', tokenId).execute();
    const ms = await until(() => seen.some((e) => e.kind === 'token' && e.ref === hash));
    expect(ms).toBeLessThan(1_000);
    await cache.get(hash, load);
    expect(loads).toBe(2);
  });

  it('a publication (any rule-set change) and a person’s change are announced; a rolled-back change is not', async () => {
    const seen: CacheEvent[] = [];
    invalidatedCache<string>({ max: 1, ttlMs: 1_000, affects: (e) => (seen.push(e), false) });
    const { userId } = await newToken();
    await db.transaction().execute(async (trx) => {
      await trx.updateTable('users').set({ name: 'Renamed' }).where('id', '=', userId).execute();
      throw new Error('roll back');
    }).catch(() => undefined);
    await new Promise((resolve) => setTimeout(resolve, 200));
    expect(seen).toHaveLength(0);
    await db.updateTable('users').set({ deactivated_at: new Date() }).where('id', '=', userId).execute();
    await until(() => seen.some((e) => e.kind === 'user' && e.ref === userId));
    await db.updateTable('jurisdictions').set({ name: sql`name` }).execute();
    await until(() => seen.some((e) => e.kind === 'jurisdiction'));
  });

  it('answers from the database while its listening connection is down, and listens again by itself', async () => {
    let loads = 0;
    const cache = invalidatedCache<number>({ max: 10, ttlMs: 60_000, affects: () => true });
    const load = async () => ++loads;
    await cache.get('k', load);
    await cache.get('k', load);
    expect(loads).toBe(1);
    // The database ends the listening session (a restart or a failover looks the same from here).
    await sql`SELECT pg_terminate_backend(pid) FROM pg_stat_activity WHERE datname = current_database() AND query ILIKE 'LISTEN%'`.execute(db);
    await until(() => !isListening());
    await cache.get('k', load);
    expect(loads).toBe(2);
    await until(() => isListening(), 5_000);
    await cache.get('k', load);
    await cache.get('k', load);
    expect(loads).toBe(3);
  });
});
