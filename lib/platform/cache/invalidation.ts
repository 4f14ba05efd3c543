import 'server-only';
import { LRUCache } from 'lru-cache';
import pg from 'pg';

/**
 * Copies of database rows kept in this app server's memory, dropped the moment any server (or script) changes
 * the rows: triggers announce every such change on the PostgreSQL channel `nookpass_cache` (migration
 * 2026-12-06T08-00-00), and one listening connection per process passes each announcement to the caches.
 *
 * A cache answers only while that connection is up. Before it is up, after it drops, and until it is back,
 * every read goes to the database, so no server can keep serving a revoked token or an old publication for
 * longer than it takes PostgreSQL to deliver a notification. The time limit on each entry is a backstop.
 */

export const CACHE_CHANNEL = 'nookpass_cache';

export type CacheEvent = { kind: 'token' | 'user' | 'rule-set' | 'jurisdiction'; ref: string | null };

type Subscriber = (event: CacheEvent | 'all') => void;

type ListenerState = {
  client: pg.Client | null;
  listening: boolean;
  connecting: Promise<void> | null;
  retryTimer: NodeJS.Timeout | null;
  subscribers: Set<Subscriber>;
};

// One connection per process: pages and route handlers are bundled apart, and each bundle's caches subscribe here.
const globalForCache = globalThis as unknown as { nookpassCacheListener?: ListenerState };

function state(): ListenerState {
  globalForCache.nookpassCacheListener ??= { client: null, listening: false, connecting: null, retryTimer: null, subscribers: new Set() };
  return globalForCache.nookpassCacheListener;
}

function broadcast(event: CacheEvent | 'all'): void {
  for (const subscriber of state().subscribers) subscriber(event);
}

function parseEvent(payload: string | undefined): CacheEvent | 'all' {
  try {
    const parsed = JSON.parse(payload ?? '') as CacheEvent;
    if (parsed && typeof parsed.kind === 'string') return parsed;
  } catch {
    // an announcement we cannot read: drop everything rather than guess
  }
  return 'all';
}

function lost(client: pg.Client): void {
  const s = state();
  if (s.client !== client) return;
  s.client = null;
  s.listening = false;
  broadcast('all');
  client.end().catch(() => undefined);
  if (!s.retryTimer) {
    s.retryTimer = setTimeout(() => {
      s.retryTimer = null;
      void startListening();
    }, 1_000);
    s.retryTimer.unref();
  }
}

/** Connects the process's listening connection if it is not up; resolves once LISTEN is in place (or failed). */
export function startListening(): Promise<void> {
  const s = state();
  if (s.listening) return Promise.resolve();
  if (s.connecting) return s.connecting;
  const url = process.env.DATABASE_URL;
  if (!url) return Promise.resolve();
  const client = new pg.Client({ connectionString: url, connectionTimeoutMillis: 5_000 });
  s.connecting = (async () => {
    client.on('error', () => lost(client));
    client.on('end', () => lost(client));
    client.on('notification', (msg) => {
      if (msg.channel === CACHE_CHANNEL) broadcast(parseEvent(msg.payload));
    });
    try {
      await client.connect();
      await client.query(`LISTEN ${CACHE_CHANNEL}`);
      s.client = client;
      s.listening = true;
      // Anything cached before this moment may have missed an announcement.
      broadcast('all');
    } catch {
      s.client = client;
      lost(client);
    } finally {
      s.connecting = null;
    }
  })();
  return s.connecting;
}

/**
 * Drops every copy this server holds, at once. A service calls it after committing a change to what the caches
 * copy (a revocation, a deactivation, a publication), so the next request to this server sees the change even
 * before the database's announcement comes back over the listening connection; other servers hear the
 * announcement as usual. Such changes are rare, so dropping everything costs a few reloads.
 */
export function forgetCachedCopies(): void {
  broadcast('all');
}

export function isListening(): boolean {
  return state().listening;
}

/** Ends the listening connection (tests, shutdown); caches stop answering until startListening() again. */
export async function stopListening(): Promise<void> {
  const s = state();
  if (s.retryTimer) clearTimeout(s.retryTimer);
  s.retryTimer = null;
  const client = s.client;
  s.client = null;
  s.listening = false;
  broadcast('all');
  if (client) await client.end().catch(() => undefined);
}

/**
 * A cache of database copies, dropped by announcements: `affects` says which announcements make an entry wrong
 * (true drops the whole cache, a key drops that entry). Reads bypass the cache while the listener is down.
 */
export function invalidatedCache<V extends NonNullable<unknown>>(options: {
  max: number;
  ttlMs: number;
  affects: (event: CacheEvent) => boolean | string;
}): { get: (key: string, load: () => Promise<V | null>) => Promise<V | null>; clear: () => void } {
  const cache = new LRUCache<string, V>({ max: options.max, ttl: options.ttlMs });
  // Bumped on every drop: a load that started before an announcement must not store what it read.
  let generation = 0;
  state().subscribers.add((event) => {
    if (event === 'all') {
      generation++;
      cache.clear();
      return;
    }
    const hit = options.affects(event);
    if (hit === true) {
      generation++;
      cache.clear();
    } else if (typeof hit === 'string') {
      generation++;
      cache.delete(hit);
    }
  });
  return {
    async get(key, load) {
      if (!isListening()) {
        void startListening();
        return load();
      }
      const hit = cache.get(key);
      if (hit !== undefined) return hit;
      const started = generation;
      const loaded = await load();
      if (loaded !== null && started === generation && isListening()) cache.set(key, loaded);
      return loaded;
    },
    clear() {
      generation++;
      cache.clear();
    },
  };
}
