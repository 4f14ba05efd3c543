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

// For a limit met many times a second, a server counts points in blocks and answers from memory (countAhead).
describe('counting ahead', () => {
  const ahead = (name: string, points: number, countAhead: number, durationSeconds = 60): LimitPolicy => ({ ...policy(name, points, durationSeconds), countAhead });
  /** A pool that counts the queries sent through it: the round trips a server makes. */
  const countingPool = (pool: pg.Pool) => {
    const counter = { queries: 0 };
    const proxy = new Proxy(pool, {
      get(target, prop, receiver) {
        if (prop === 'query') return (...args: unknown[]) => { counter.queries += 1; return (target.query as (...a: unknown[]) => unknown)(...args); };
        const value = Reflect.get(target, prop, receiver);
        return typeof value === 'function' ? value.bind(target) : value;
      },
    });
    return { pool: proxy, counter };
  };

  it('answers most requests from memory, and the shared count covers every answered one', async () => {
    const { pool, counter } = countingPool(poolA);
    const l = new SharedLimiter(pool);
    const p = ahead('it-ahead-many', 10_000, 50);
    for (let i = 0; i < 500; i += 1) await l.consume(p, 'integration');
    // The first point (to learn what is left), then blocks of 50: 11 round trips, not 500.
    expect(counter.queries).toBeLessThanOrEqual(12);
    const shared = await new SharedLimiter(poolB).peek(p, 'integration');
    expect(shared.consumed).toBeGreaterThanOrEqual(500);
    expect(shared.consumed).toBeLessThanOrEqual(500 + 50);
  });

  it('counts one at a time a limit that blocks once over (blockSeconds), whatever countAhead says', async () => {
    const { pool, counter } = countingPool(poolA);
    const l = new SharedLimiter(pool);
    const p: LimitPolicy = { ...policy('it-ahead-blocking', 1000, 60, 120), countAhead: 50 };
    for (let i = 0; i < 20; i += 1) await l.consume(p, 'k');
    expect(counter.queries).toBe(20);
  });

  it('asks once for concurrent requests: 200 at once on one server make a handful of round trips', async () => {
    const { pool, counter } = countingPool(poolA);
    const l = new SharedLimiter(pool);
    const p = ahead('it-ahead-burst', 10_000, 50);
    await l.consume(p, 'burst');
    const results = await Promise.allSettled(Array.from({ length: 200 }, () => l.consume(p, 'burst')));
    expect(results.every((r) => r.status === 'fulfilled')).toBe(true);
    expect(counter.queries).toBeLessThanOrEqual(6);
  });

  it('never answers more than the limit across two servers: of 400 parallel requests against 250, at most 250 pass', async () => {
    const servers = [new SharedLimiter(poolA), new SharedLimiter(poolB)];
    const p = ahead('it-ahead-parallel', 250, 25);
    // Each server has counted before, so it knows what is left and asks in blocks.
    await servers[0].consume(p, 'shared');
    await servers[1].consume(p, 'shared');
    const results = await Promise.allSettled(Array.from({ length: 400 }, (_, i) => servers[i % 2].consume(p, 'shared')));
    const passed = results.filter((r) => r.status === 'fulfilled').length + 2;
    expect(passed).toBeLessThanOrEqual(250);
    // Blocks shrink near the limit, so little is left unused in a server's memory when the limit is reached.
    expect(passed).toBeGreaterThanOrEqual(250 - 2 * 25);
    const refused = results.find((r) => r.status === 'rejected') as PromiseRejectedResult;
    expect(refused.reason).toBeInstanceOf(TooManyRequestsError);
    expect((refused.reason as TooManyRequestsError).retryAfterSeconds).toBeGreaterThan(0);
  });

  it('near the limit counts one at a time: after another server counted all but one, one passes and the next is refused', async () => {
    const p = ahead('it-ahead-edge', 1200, 12);
    await new SharedLimiter(poolB).penalize(p, 'token', 1199);
    const l = new SharedLimiter(poolA);
    await expect(l.consume(p, 'token')).resolves.toMatchObject({ remaining: 0 });
    await expect(l.consume(p, 'token')).rejects.toBeInstanceOf(TooManyRequestsError);
    // A refusal counts one point, as it does without counting ahead.
    expect((await l.peek(p, 'token')).consumed).toBe(1201);
  });

  it('keeps the part of a block under the limit when another server took points meanwhile, and gives the rest back', async () => {
    const p = ahead('it-ahead-partial', 1000, 50);
    const a = new SharedLimiter(poolA);
    const b = new SharedLimiter(poolB);
    await a.consume(p, 'k'); // a learns 999 are left
    await b.penalize(p, 'k', 980); // meanwhile b counts 980: 19 left
    await a.consume(p, 'k'); // a asks for 50, is over by 31, keeps 19 and gives 31 back
    expect((await b.peek(p, 'k')).consumed).toBe(1000);
    for (let i = 0; i < 18; i += 1) await a.consume(p, 'k');
    await expect(a.consume(p, 'k')).rejects.toBeInstanceOf(TooManyRequestsError);
    await expect(b.consume(p, 'k')).rejects.toBeInstanceOf(TooManyRequestsError);
  });

  it('drops what a server holds when the window ends, and counts the new window afresh', async () => {
    const p = ahead('it-ahead-window', 1000, 50, 1);
    const l = new SharedLimiter(poolA);
    await l.consume(p, 'w');
    await l.consume(p, 'w'); // a block of 50, 49 held
    await new Promise((resolve) => setTimeout(resolve, 1_200));
    await l.consume(p, 'w');
    // The new window holds only the new request's block: nothing carried over from the old one.
    expect((await new SharedLimiter(poolB).peek(p, 'w')).consumed).toBeLessThanOrEqual(50);
  });
});

describe('the client address', () => {
  it('is the right-most X-Forwarded-For entry: the one the nearest proxy appended', () => {
    const r = new Request('http://x/', { headers: { 'x-forwarded-for': '203.0.113.9, 198.51.100.7' } });
    expect(clientAddress(r)).toBe('198.51.100.7');
    expect(clientAddress(new Request('http://x/'))).toBe('unknown');
  });
});
