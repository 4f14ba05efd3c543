// npm run admin:create -- --email a@b.c --name "A Person" [--another]
// Creates an administrator in DATABASE_URL. The password comes from NOOKPASS_ADMIN_PASSWORD (for scripts) or
// is asked for twice on the terminal, without echo.
import { parseArgs } from 'node:util';
import { read } from 'read';
import { createDb } from '@/db/index';
import { ConflictError, ValidationError } from '@/lib/domain/errors';
import { MIN_NEW_PASSWORD_LENGTH } from '@/lib/domain/accounts/password-policy';
import { createAdmin } from '@/lib/services/accounts/admin';

function fail(message: string): never {
  console.error(`[admin:create] ${message}`);
  process.exit(1);
}

async function askPassword(): Promise<string> {
  const fromEnv = process.env.NOOKPASS_ADMIN_PASSWORD;
  if (fromEnv) return fromEnv;
  if (!process.stdin.isTTY) fail('No terminal to ask for the password on: set NOOKPASS_ADMIN_PASSWORD.');
  const first = await read({ prompt: `Password (at least ${MIN_NEW_PASSWORD_LENGTH} characters): `, silent: true, replace: '' });
  const again = await read({ prompt: 'Same password again: ', silent: true, replace: '' });
  if (first !== again) fail('The two passwords differ; nothing was created.');
  return first;
}

async function main() {
  const { values } = parseArgs({
    options: { email: { type: 'string' }, name: { type: 'string' }, another: { type: 'boolean', default: false } },
    strict: true,
  });
  if (!values.email || !values.name) fail('usage: npm run admin:create -- --email <address> --name "<full name>" [--another]');
  const url = process.env.DATABASE_URL;
  if (!url) fail('DATABASE_URL is not set.');
  const db = createDb(url, 1);
  try {
    const password = await askPassword();
    const admin = await createAdmin(db, { email: values.email, name: values.name, password }, { another: values.another });
    console.log(`[admin:create] administrator ${admin.email} created; sign in at ${process.env.NEXTAUTH_URL ?? 'the app'}/sign-in`);
  } catch (err) {
    if (err instanceof ValidationError) fail(err.errors.map((e) => `${e.path}: ${e.message}`).join('\n'));
    if (err instanceof ConflictError) fail(err.message);
    throw err;
  } finally {
    await db.destroy();
  }
}

main().catch((err) => {
  console.error('[admin:create]', err);
  process.exit(1);
});
