import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { migrateToLatest } from '@/db/migrator';
import { TooManyRequestsError } from '@/lib/domain/errors';
import { clientAddress, SharedLimiter, type LimitPolicy } from '@/lib/platform/rate-limit';
import { createScratchDb, testPool } from './helpers';

let scratch: Awaited<ReturnType<typeof createScratchDb>>;
let poolA: pg.Pool;
let poolB: pg.Pool;

beforeAll(async () => {
  scratch = await createScratchDb();
  const { error } = await migrateToLatest(scratch.db);
  if (error) throw error;
  poolA = testPool(scratch.url, 4);
  poolB = testPool(scratch.url, 4);
});
afterAll(async () => {
  await poolA?.end();
  await poolB?.end();
  await scratch?.drop();
});

const policy = (name: string, points = 3, durationSeconds = 60, blockSeconds?: number): LimitPolicy => ({
  name,
  points,
  durationSeconds,
  blockSeconds,
  message: 'Too many tries; wait a moment.',
});

describe('the shared rate limiter', () => {
  it('counts across two app servers on one database and answers with Retry-After', async () => {
    // Two limiters over two pools stand for two app servers.
    const a = new SharedLimiter(poolA);
    const b = new SharedLimiter(poolB);
    const p = policy('it-shared');
    await a.consume(p, 'client-1');
    await b.consume(p, 'client-1');
    await a.consume(p, 'client-1');
    const refused = await b.consume(p, 'client-1').then(() => null, (e: unknown) => e);
    expect(refused).toBeInstanceOf(TooManyRequestsError);
    expect((refused as TooManyRequestsError).retryAfterSeconds).toBeGreaterThan(0);
    expect((refused as TooManyRequestsError).retryAfterSeconds).toBeLessThanOrEqual(60);
    // Another key is untouched.
    await expect(a.consume(p, 'client-2')).resolves.toMatchObject({ consumed: 1, remaining: 2 });
  });

  it('holds under concurrency: of 20 parallel requests against a limit of 10, exactly 10 pass', async () => {
    const servers = [new SharedLimiter(poolA), new SharedLimiter(poolB)];
    const p = policy('it-parallel', 10);
    const results = await Promise.allSettled(Array.from({ length: 20 }, (_, i) => servers[i % 2].consume(p, 'burst')));
    expect(results.filter((r) => r.status === 'fulfilled')).toHaveLength(10);
  });

  it('penalizes without refusing, refuses with assertUnder once over, and resets', async () => {
    const l = new SharedLimiter(poolA);
    const p = policy('it-penalty', 2, 60, 120);
    await l.assertUnder(p, 'k');
    await l.penalize(p, 'k');
    await l.assertUnder(p, 'k');
    expect((await l.penalize(p, 'k')).remaining).toBe(0);
    await expect(l.assertUnder(p, 'k')).rejects.toBeInstanceOf(TooManyRequestsError);
    await l.reset(p, 'k');
    await expect(l.assertUnder(p, 'k')).resolves.toBeUndefined();
  });

  it('keeps no key in plain text and sweeps expired counters', async () => {
    const l = new SharedLimiter(poolA);
    await l.consume(policy('it-private', 5, 1), 'someone@example.test');
    const rows = await poolA.query<{ key: string }>('SELECT key FROM rate_limits');
    expect(rows.rows.some((r) => r.key.includes('someone'))).toBe(false);
    expect(await l.sweepExpired(Date.now() + 5_000)).toBeGreaterThan(0);
    const left = await poolA.query("SELECT 1 FROM rate_limits WHERE key LIKE 'it-private%'");
    expect(left.rowCount).toBe(0);
  });
});

describe('the client address', () => {
  it('is the right-most X-Forwarded-For entry: the one the nearest proxy appended', () => {
    const r = new Request('http://x/', { headers: { 'x-forwarded-for': '203.0.113.9, 198.51.100.7' } });
    expect(clientAddress(r)).toBe('198.51.100.7');
    expect(clientAddress(new Request('http://x/'))).toBe('unknown');
  });
});
