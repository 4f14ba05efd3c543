import bcrypt from 'bcryptjs';
import { describe, expect, it } from 'vitest';
import { MIN_PASSWORD_LENGTH, PASSWORD_COST, PasswordCheckBusyError, dummyHash, hashCost, hashPassword, needsRehash, verifyPassword } from '@/lib/platform/auth/password';

describe('password hashing', () => {
  it('stores a bcrypt hash that verifies the password and nothing else', async () => {
    const hash = await hashPassword('correct horse battery', 4);
    // bcrypt's modular-crypt format: $2a$/$2b$, two-digit cost, 53 characters of salt and digest (OpenBSD bcrypt).
    expect(hash).toMatch(/^\$2[ab]\$04\$[./A-Za-z0-9]{53}$/);
    expect(hash).not.toContain('correct horse');
    expect(await verifyPassword('correct horse battery', hash)).toBe(true);
    expect(await verifyPassword('correct horse batterY', hash)).toBe(false);
  });

  it('salts every hash', async () => {
    const a = await hashPassword('same password here', 4);
    const b = await hashPassword('same password here', 4);
    expect(a).not.toBe(b);
  });

  it('refuses short passwords', async () => {
    await expect(hashPassword('x'.repeat(MIN_PASSWORD_LENGTH - 1), 4)).rejects.toThrow(/at least/);
  });

  it('checks against the reference implementation', async () => {
    // Cross-check with bcryptjs directly: a hash made by our helper verifies with the library's compare.
    const hash = await hashPassword('interoperable-pass', 4);
    expect(await bcrypt.compare('interoperable-pass', hash)).toBe(true);
  });

  it('compares unknown e-mails against a dummy hash of the cost real hashes are made with', async () => {
    const dummy = await dummyHash();
    expect(hashCost(dummy)).toBe(PASSWORD_COST);
    expect(hashCost(await hashPassword('a new password', undefined))).toBe(PASSWORD_COST);
    // OWASP Password Storage Cheat Sheet: bcrypt work factor 10 or more.
    expect(PASSWORD_COST).toBeGreaterThanOrEqual(10);
  });

  it('asks for a rehash of hashes below the current cost, and of anything that is not bcrypt', async () => {
    expect(needsRehash(await hashPassword('an older password', 4))).toBe(true);
    expect(needsRehash(bcrypt.hashSync('made elsewhere', 10))).toBe(true);
    expect(needsRehash(await dummyHash())).toBe(false);
    expect(needsRehash('not a hash')).toBe(true);
  });

  it('reads hashes made by another bcrypt implementation ($2a$ and $2b$ prefixes)', async () => {
    // The demo and test data were hashed with bcryptjs; OpenBSD bcrypt defines both prefixes.
    const a = bcrypt.hashSync('written by bcryptjs', 4).replace(/^\$2b\$/, '$2a$');
    expect(await verifyPassword('written by bcryptjs', a)).toBe(true);
    expect(await verifyPassword('written by bcryptjs', bcrypt.hashSync('written by bcryptjs', 4))).toBe(true);
  });

  it('answers false, not an error, for a stored value that is not a hash', async () => {
    expect(await verifyPassword('anything at all', 'not-a-bcrypt-hash')).toBe(false);
  });

  it('keeps the queue of waiting password checks bounded: past it the answer is "busy" at once', async () => {
    const hash = await hashPassword('queue bound test', 4);
    const results = await Promise.allSettled(Array.from({ length: 60 }, () => verifyPassword('queue bound test', hash)));
    const busy = results.filter((r) => r.status === 'rejected' && r.reason instanceof PasswordCheckBusyError);
    const checked = results.filter((r) => r.status === 'fulfilled' && r.value === true);
    expect(busy.length).toBeGreaterThan(0);
    expect(checked.length).toBeGreaterThanOrEqual(32);
    expect(busy.length + checked.length).toBe(60);
  });
});
