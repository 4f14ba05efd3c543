import { spawnSync } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { migrateToLatest } from '@/db/migrator';
import { PASSWORD_TOO_SHORT } from '@/lib/domain/accounts/password-policy';
import { verifyPassword } from '@/lib/platform/auth/password';
import { createScratchDb } from './helpers';

/*
 * A production start: with NOOKPASS_DEMO unset nothing is seeded, and the first administrator comes from
 * `npm run admin:create` (password from NOOKPASS_ADMIN_PASSWORD here; the terminal prompt is the same code
 * path with `read`). A second administrator needs --another.
 */

let scratch: Awaited<ReturnType<typeof createScratchDb>>;
beforeAll(async () => {
  scratch = await createScratchDb();
  const { error } = await migrateToLatest(scratch.db);
  if (error) throw error;
});
afterAll(async () => {
  await scratch?.drop();
});

function run(script: string, args: string[], env: Record<string, string | undefined>) {
  const base = { ...process.env, DATABASE_URL: scratch.url };
  delete base.NOOKPASS_DEMO;
  delete base.NOOKPASS_ADMIN_PASSWORD;
  const res = spawnSync('npx', ['tsx', script, ...args], { env: { ...base, ...env } as NodeJS.ProcessEnv, encoding: 'utf8', timeout: 60_000, stdio: ['ignore', 'pipe', 'pipe'] });
  return { status: res.status, out: `${res.stdout}${res.stderr}` };
}

const count = async (table: 'users' | 'organizations' | 'jurisdictions' | 'projects') =>
  Number((await scratch.db.selectFrom(table).select(scratch.db.fn.countAll<string>().as('n')).executeTakeFirstOrThrow()).n);

describe('production start', () => {
  it('seeds nothing when NOOKPASS_DEMO is unset', { timeout: 60_000 }, async () => {
    const seed = run('scripts/seed.ts', [], {});
    expect(seed.status).toBe(1);
    expect(seed.out).toContain('refusing to seed');
    expect([await count('users'), await count('organizations'), await count('jurisdictions'), await count('projects')]).toEqual([0, 0, 0, 0]);
  });

  it('creates the first administrator, refuses a second without --another, and refuses weak passwords', { timeout: 120_000 }, async () => {
    const weak = run('scripts/admin-create.ts', ['--email', 'first.admin@example.test', '--name', 'First Admin'], { NOOKPASS_ADMIN_PASSWORD: 'short' });
    expect(weak.status).toBe(1);
    expect(weak.out).toContain(PASSWORD_TOO_SHORT);
    const noTerminal = run('scripts/admin-create.ts', ['--email', 'first.admin@example.test', '--name', 'First Admin'], {});
    expect(noTerminal.status).toBe(1);
    expect(noTerminal.out).toContain('NOOKPASS_ADMIN_PASSWORD');
    expect(await count('users')).toBe(0);

    const first = run('scripts/admin-create.ts', ['--email', 'First.Admin@Example.test', '--name', 'First Admin'], { NOOKPASS_ADMIN_PASSWORD: 'first admin password' });
    expect(first.status, first.out).toBe(0);
    const row = await scratch.db.selectFrom('users').selectAll().executeTakeFirstOrThrow();
    expect(row).toMatchObject({ email: 'first.admin@example.test', role: 'admin', organization_id: null, is_demo: false });
    expect(row.email_confirmed_at).not.toBeNull();
    expect(await verifyPassword('first admin password', row.password_hash)).toBe(true);
    expect(row.password_hash).not.toContain('first admin password');

    const second = run('scripts/admin-create.ts', ['--email', 'second.admin@example.test', '--name', 'Second Admin'], { NOOKPASS_ADMIN_PASSWORD: 'second admin password' });
    expect(second.status).toBe(1);
    expect(second.out).toContain('--another');
    expect(await count('users')).toBe(1);

    const another = run('scripts/admin-create.ts', ['--email', 'second.admin@example.test', '--name', 'Second Admin', '--another'], { NOOKPASS_ADMIN_PASSWORD: 'second admin password' });
    expect(another.status, another.out).toBe(0);
    const same = run('scripts/admin-create.ts', ['--email', 'second.admin@example.test', '--name', 'Again', '--another'], { NOOKPASS_ADMIN_PASSWORD: 'second admin password' });
    expect(same.status).toBe(1);
    expect(same.out).toContain('already has an account');
    const admins = await scratch.db.selectFrom('users').select('email').where('role', '=', 'admin').orderBy('email').execute();
    expect(admins.map((a) => a.email)).toEqual(['first.admin@example.test', 'second.admin@example.test']);
    const audit = await scratch.db.selectFrom('audit_log').select('action').execute();
    expect(audit.map((a) => a.action)).toEqual(['account.admin-created', 'account.admin-created']);
  });
});
