import { availableParallelism } from 'node:os';
import bcrypt from 'bcrypt';
import pLimit from 'p-limit';

// Cost 12 is about a fifth of a second here: slow for guessing, fine for one sign-in. OWASP's Password
// Storage Cheat Sheet asks for a bcrypt work factor of at least 10.
export const PASSWORD_COST = 12;
export const MIN_PASSWORD_LENGTH = 10;

/*
 * The native binding hashes on libuv's thread pool, so the event loop keeps answering while a hash runs
 * (a pure-JS bcrypt runs on the event loop itself and stalls every other request). The limit keeps a flood
 * of sign-ins from taking every core and pool thread; past MAX_WAITING queued checks the answer is "busy"
 * at once instead of a queue that only grows.
 */
const concurrency = Math.max(1, Number(process.env.NOOKPASS_PASSWORD_CONCURRENCY) || availableParallelism() - 1);
const limit = pLimit(concurrency);
const MAX_WAITING = 32;

export class PasswordCheckBusyError extends Error {
  constructor() {
    super('Too many password checks are waiting; try again in a moment.');
    this.name = 'PasswordCheckBusyError';
  }
}

function queued<T>(work: () => Promise<T>): Promise<T> {
  if (limit.pendingCount >= MAX_WAITING) return Promise.reject(new PasswordCheckBusyError());
  return limit(work);
}

/** A hash of a new password; short passwords are refused. */
export async function hashPassword(plain: string, cost = PASSWORD_COST): Promise<string> {
  if (plain.length < MIN_PASSWORD_LENGTH) {
    throw new Error(`A password needs at least ${MIN_PASSWORD_LENGTH} characters.`);
  }
  return queued(() => bcrypt.hash(plain, cost));
}

/** A hash at today's cost with no length rule: for a password just verified, or the demo password. */
export function hashAtCurrentCost(plain: string): Promise<string> {
  return queued(() => bcrypt.hash(plain, PASSWORD_COST));
}

export function verifyPassword(plain: string, hash: string): Promise<boolean> {
  return queued(() => bcrypt.compare(plain, hash));
}

/** The cost a stored hash was made with, or null when it is not a bcrypt hash. */
export function hashCost(hash: string): number | null {
  // Modular crypt format: $2a$ / $2b$ / $2y$, then the two-digit cost (OpenBSD bcrypt).
  const m = /^\$2[aby]\$(\d\d)\$/.exec(hash);
  return m ? Number(m[1]) : null;
}

/** Hashes made at a lower cost are redone at the next successful sign-in, so old accounts catch up. */
export function needsRehash(hash: string): boolean {
  const cost = hashCost(hash);
  return cost === null || cost < PASSWORD_COST;
}

let dummy: Promise<string> | undefined;

/**
 * Compared against when the e-mail is unknown, at the cost real hashes have, so an unknown e-mail and a
 * wrong password take the same time. Made once, off the event loop, on first use.
 */
export function dummyHash(): Promise<string> {
  dummy ??= bcrypt.hash('not-a-real-password-ever', PASSWORD_COST);
  return dummy;
}
