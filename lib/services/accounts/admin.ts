import type { DB } from '@/db';
import { countAdmins, emailExists, insertAdmin } from '@/db/accounts';
import { writeAudit } from '@/db/audit';
import { emailSchema } from '@/lib/domain/accounts/forms';
import { passwordFieldError } from '@/lib/domain/accounts/password-policy';
import { ConflictError, ValidationError, type FieldError } from '@/lib/domain/errors';
import type { AppUser } from '@/lib/domain/roles';
import { hashPassword } from '@/lib/platform/auth/password';

export const SECOND_ADMIN_REFUSED =
  'An administrator already exists. Add --another to create one more (or have an administrator invite them).';

/**
 * An administrator made by whoever runs the server (the command line), for a production start with no demo:
 * the first one, or another with `another`. Same password rule as everyone else.
 */
export async function createAdmin(db: DB, input: { email: string; name: string; password: string }, opts: { another?: boolean } = {}): Promise<AppUser> {
  const errors: FieldError[] = [];
  const email = emailSchema.safeParse(input.email);
  if (!email.success) errors.push({ path: 'email', message: email.error.issues[0]?.message ?? 'Enter an e-mail address.' });
  const name = input.name.trim();
  if (!name || name.length > 120) errors.push({ path: 'name', message: 'Give a name of 1 to 120 characters.' });
  const weak = passwordFieldError(input.password, email.success ? email.data : input.email);
  if (weak) errors.push(weak);
  if (errors.length) throw new ValidationError(errors);
  if (!opts.another && (await countAdmins(db)) > 0) throw new ConflictError(SECOND_ADMIN_REFUSED);
  if (await emailExists(db, email.data!)) throw new ValidationError([{ path: 'email', message: 'This e-mail address already has an account.' }]);
  const passwordHash = await hashPassword(input.password);
  return db.transaction().execute(async (trx) => {
    const admin = await insertAdmin(trx, { email: email.data!, name, passwordHash });
    await writeAudit(trx, { actorUserId: null, action: 'account.admin-created', entityType: 'user', entityId: admin.id, details: { email: admin.email, via: 'command line' } });
    return admin;
  });
}
