import 'server-only';
import type { DB } from '@/db';
import { findTokenHolder, touchApiToken, type TokenHolder } from '@/db/api-tokens';
import { invalidatedCache } from '@/lib/platform/cache/invalidation';

/*
 * Token look-ups are the one database read on every API call an integration makes. Holders are kept in memory
 * and dropped on any change to the token or its person (revocation, expiry, deactivation, role), announced by
 * the database to every app server; see lib/platform/cache/invalidation.ts.
 */
const holders = invalidatedCache<TokenHolder>({
  max: 10_000,
  ttlMs: 5 * 60_000,
  // A token change names its hash; a person's change may touch any of their tokens, and is rare: drop all.
  affects: (event) => (event.kind === 'token' ? (event.ref ?? true) : event.kind === 'user'),
});

// Last-used times are kept to the minute: one write per token per minute, not one per request.
const TOUCH_EVERY_MS = 60_000;
const touchedAt = new Map<string, number>();

/** The holder of a live (not revoked) token, from memory when this server has it; null for an unknown or revoked one. */
export async function tokenHolder(db: DB, tokenHash: string): Promise<TokenHolder | null> {
  const holder = await holders.get(tokenHash, () => findTokenHolder(db, tokenHash));
  if (holder && holder.expiresAt.getTime() > Date.now()) {
    const now = Date.now();
    const last = Math.max(touchedAt.get(holder.tokenId) ?? 0, holder.lastUsedAt?.getTime() ?? 0);
    if (now - last > TOUCH_EVERY_MS) {
      touchedAt.set(holder.tokenId, now);
      if (touchedAt.size > 10_000) touchedAt.delete(touchedAt.keys().next().value!);
      await touchApiToken(db, holder.tokenId, new Date(now));
    }
  }
  return holder;
}
