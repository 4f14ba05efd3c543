import 'server-only';
import { createHash } from 'node:crypto';
import type pg from 'pg';
import { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible';
import { getPool } from '@/db';
import { TooManyRequestsError } from '@/lib/domain/errors';

/**
 * One limit: at most `points` within `durationSeconds` per key; once over, the key stays refused for
 * `blockSeconds` (default: until the window ends). `message` is what the person who hit it reads.
 */
export type LimitPolicy = {
  name: string;
  points: number;
  durationSeconds: number;
  blockSeconds?: number;
  message: string;
  /**
   * For a limit met many times a second (the evaluation API): an app server may count up to this many points in
   * the shared store at once and hand them out from memory, so most requests need no round trip to PostgreSQL.
   * Points are counted before they are used, so the limit is never exceeded across servers; near the limit the
   * blocks shrink to single points. Ignored for a limit with `blockSeconds` (its refusal must stay exact).
   */
  countAhead?: number;
};

export type LimitState = { consumed: number; remaining: number; retryAfterSeconds: number };

const TABLE = 'rate_limits';

function state(policy: LimitPolicy, res: RateLimiterRes | null): LimitState {
  if (!res) return { consumed: 0, remaining: policy.points, retryAfterSeconds: 0 };
  return { consumed: res.consumedPoints, remaining: res.remainingPoints, retryAfterSeconds: Math.max(1, Math.ceil(res.msBeforeNext / 1000)) };
}

/** Points an app server has counted in the shared store and not yet handed out, for one policy and key. */
type Reserve = { left: number; endsAt: number; sharedRemaining: number; pending: Promise<void> | null };

// A block is at most this share of what the shared counter had left when last asked, so the blocks of several
// app servers shrink together as a key nears its limit (an operating setting: common practice, no published source).
const BLOCK_SHARE_OF_REMAINING = 1 / 8;
const RESERVES_BEFORE_PRUNING = 10_000;

/**
 * Counters live in PostgreSQL (rate-limiter-flexible's store), so every app server counts against the same
 * limit. Keys are hashed: they may be e-mail addresses, which the counter table has no need to hold.
 */
export class SharedLimiter {
  private readonly limiters = new Map<string, RateLimiterPostgres>();
  private readonly reserves = new Map<string, Reserve>();

  constructor(private readonly pool: pg.Pool) {}

  private limiter(policy: LimitPolicy): RateLimiterPostgres {
    let limiter = this.limiters.get(policy.name);
    if (!limiter) {
      limiter = new RateLimiterPostgres({
        storeClient: this.pool,
        storeType: 'pool',
        tableName: TABLE,
        tableCreated: true, // made by a migration, not at run time
        clearExpiredByTimeout: false, // expired rows are removed by sweepExpired()
        keyPrefix: policy.name,
        points: policy.points,
        duration: policy.durationSeconds,
        blockDuration: policy.blockSeconds ?? 0,
      });
      this.limiters.set(policy.name, limiter);
    }
    return limiter;
  }

  private static key(key: string): string {
    return createHash('sha256').update(key).digest('base64url');
  }

  /** Counts one request; over the limit it throws TooManyRequestsError (429 with Retry-After). */
  async consume(policy: LimitPolicy, key: string, points = 1): Promise<LimitState> {
    if (policy.countAhead && policy.countAhead > 1 && !policy.blockSeconds && points === 1) return this.consumeFromReserve(policy, key);
    try {
      return state(policy, await this.limiter(policy).consume(SharedLimiter.key(key), points));
    } catch (err) {
      if (err instanceof RateLimiterRes) throw new TooManyRequestsError(policy.message, state(policy, err).retryAfterSeconds);
      throw err;
    }
  }

  /**
   * One point from this server's reserve for the key; when the reserve is empty (or its window ended) one
   * request counts a block in the shared store while concurrent requests for the key wait for it.
   */
  private async consumeFromReserve(policy: LimitPolicy, key: string): Promise<LimitState> {
    const id = `${policy.name}:${key}`;
    let reserve = this.reserves.get(id);
    if (!reserve) {
      if (this.reserves.size >= RESERVES_BEFORE_PRUNING) this.forgetEndedReserves();
      reserve = { left: 0, endsAt: 0, sharedRemaining: -1, pending: null };
      this.reserves.set(id, reserve);
    }
    for (;;) {
      // Points left over when the window ends were counted in that window only; they are dropped with it.
      if (reserve.endsAt <= Date.now()) reserve.left = 0;
      if (reserve.left > 0) {
        reserve.left -= 1;
        const remaining = reserve.sharedRemaining + reserve.left;
        return { consumed: policy.points - remaining, remaining, retryAfterSeconds: 0 };
      }
      if (reserve.pending) {
        await reserve.pending.catch(() => undefined);
        continue;
      }
      const counting = this.countBlock(policy, SharedLimiter.key(key), reserve).finally(() => {
        reserve.pending = null;
      });
      reserve.pending = counting;
      await counting;
    }
  }

  /** Counts a block of points for the key in the shared store and keeps what may be used of it. */
  private async countBlock(policy: LimitPolicy, hashedKey: string, reserve: Reserve): Promise<void> {
    const limiter = this.limiter(policy);
    // Nothing known yet (a new key or a new app server): one point, whose answer tells what is left.
    const block = reserve.sharedRemaining < 0 ? 1 : Math.max(1, Math.min(policy.countAhead ?? 1, Math.floor(reserve.sharedRemaining * BLOCK_SHARE_OF_REMAINING)));
    try {
      const res = await limiter.consume(hashedKey, block);
      reserve.left = block;
      reserve.sharedRemaining = res.remainingPoints;
      reserve.endsAt = Date.now() + res.msBeforeNext;
    } catch (err) {
      if (!(err instanceof RateLimiterRes)) throw err;
      // Another server took points meanwhile: keep the part of the block still under the limit, give back the rest.
      const over = err.consumedPoints - policy.points;
      const usable = block - over;
      reserve.sharedRemaining = 0;
      reserve.endsAt = Date.now() + err.msBeforeNext;
      if (usable >= 1) {
        await limiter.reward(hashedKey, over);
        reserve.left = usable;
        return;
      }
      // Refused: the count keeps one point for this request, as a refused single request's does.
      if (block > 1) await limiter.reward(hashedKey, block - 1);
      reserve.left = 0;
      throw new TooManyRequestsError(policy.message, state(policy, err).retryAfterSeconds);
    }
  }

  /** Forgets reserves whose window ended (they hold nothing). */
  private forgetEndedReserves(now = Date.now()): void {
    for (const [id, reserve] of this.reserves) if (reserve.endsAt <= now && !reserve.pending) this.reserves.delete(id);
  }

  /** Counts without refusing (a failed attempt, say); the answer tells whether the key is now over. */
  async penalize(policy: LimitPolicy, key: string, points = 1): Promise<LimitState> {
    const res = await this.limiter(policy).penalty(SharedLimiter.key(key), points);
    return state(policy, res);
  }

  /** Throws TooManyRequestsError when the key is already over the limit; counts nothing. */
  async assertUnder(policy: LimitPolicy, key: string): Promise<void> {
    const s = state(policy, await this.limiter(policy).get(SharedLimiter.key(key)));
    if (s.consumed >= policy.points && s.consumed > 0) throw new TooManyRequestsError(policy.message, s.retryAfterSeconds);
  }

  /** Gives points back, for an attempt counted up front that turned out to be legitimate. */
  async reward(policy: LimitPolicy, key: string, points = 1): Promise<LimitState> {
    return state(policy, await this.limiter(policy).reward(SharedLimiter.key(key), points));
  }

  async peek(policy: LimitPolicy, key: string): Promise<LimitState> {
    return state(policy, await this.limiter(policy).get(SharedLimiter.key(key)));
  }

  async reset(policy: LimitPolicy, key: string): Promise<void> {
    await this.limiter(policy).delete(SharedLimiter.key(key));
  }

  /** Deletes counters whose window ended; any app server may run it, as often as it likes. */
  async sweepExpired(now = Date.now()): Promise<number> {
    const res = await this.pool.query(`DELETE FROM ${TABLE} WHERE expire IS NOT NULL AND expire < $1`, [now]);
    return res.rowCount ?? 0;
  }
}

const globalForLimiter = globalThis as unknown as { nookpassLimiterSweep?: NodeJS.Timeout };

const SWEEP_EVERY_MS = 10 * 60_000;

// One per module instance, not one per process: pages and route handlers are bundled apart, each with its
// own copy of lib/errors, and a limiter shared through globalThis would throw the other bundle's
// TooManyRequestsError, which `instanceof` there does not recognise. The counters are in PostgreSQL anyway.
let moduleLimiter: SharedLimiter | undefined;

/** The app's limiter over the app's pool; expired counters are swept every ten minutes (one sweep per process). */
export function sharedLimiter(): SharedLimiter {
  if (!moduleLimiter) {
    const limiter = new SharedLimiter(getPool());
    moduleLimiter = limiter;
    if (!globalForLimiter.nookpassLimiterSweep) {
      const sweep = setInterval(() => limiter.sweepExpired().catch(() => undefined), SWEEP_EVERY_MS);
      sweep.unref();
      globalForLimiter.nookpassLimiterSweep = sweep;
    }
  }
  return moduleLimiter;
}

/**
 * The client's address for per-address limits: the right-most X-Forwarded-For entry, which is the one the
 * nearest proxy appended (Next.js fills the header with the socket's address when no proxy sent one).
 * Behind a reverse proxy, set it to append the client address ($proxy_add_x_forwarded_for or equivalent).
 */
export function clientAddress(request: Pick<Request, 'headers'>): string {
  return clientAddressOf(request.headers);
}

/** The same, from the headers a server component reads with next/headers. */
export function clientAddressOf(headers: Pick<Headers, 'get'>): string {
  const forwarded = headers.get('x-forwarded-for');
  const last = forwarded?.split(',').map((s) => s.trim()).filter(Boolean).at(-1);
  return last || headers.get('x-real-ip') || 'unknown';
}
