import 'server-only';
import type { DB } from '@/db';
import { emailExists, insertCompanyWithOwner, organizationNameExists } from '@/db/accounts';
import { writeAudit } from '@/db/audit';
import { insertEmailToken } from '@/db/email-tokens';
import type { SignUpInput } from '@/lib/domain/accounts/forms';
import { ValidationError, type FieldError } from '@/lib/domain/errors';
import type { OutboxMail } from '@/lib/domain/mail/outbox';
import type { AppUser } from '@/lib/domain/roles';
import { hashPassword } from '@/lib/platform/auth/password';
import { newOneTimeToken } from '@/lib/platform/auth/one-time-token';
import { CONFIRMATION_LIFETIME_SECONDS, queueWelcomeMail } from '@/lib/services/accounts/account-mail';
import { dispatchMail } from '@/lib/services/mail/outbox';
import { countSignUp } from '@/lib/services/accounts/limits';

const EMAIL_TAKEN = 'This e-mail address already has a NookPass account: sign in, or reset the password from the sign-in page.';
const COMPANY_TAKEN = 'A company with this name is already on NookPass. If you work there, ask its owner to invite you; otherwise add what sets yours apart (a town, a trade).';

function isUniqueViolation(err: unknown, constraint: string): boolean {
  const e = err as { code?: string; constraint?: string };
  return e?.code === '23505' && e.constraint === constraint;
}

export type SignUpResult = { user: AppUser; organizationId: string; welcomeMail: Pick<OutboxMail, 'id' | 'status'> };

/**
 * A new installer company and its first person, its owner, in one transaction (with the confirmation
 * token, the audit row and the queued welcome e-mail); a job delivers the e-mail, so a mail server that is
 * down never holds up or undoes the sign-up.
 */
export async function signUpCompany(db: DB, input: SignUpInput, ctx: { address: string }): Promise<SignUpResult> {
  await countSignUp(input.email, ctx.address);
  const taken: FieldError[] = [];
  if (await emailExists(db, input.email)) taken.push({ path: 'email', message: EMAIL_TAKEN });
  if (await organizationNameExists(db, input.company)) taken.push({ path: 'company', message: COMPANY_TAKEN });
  if (taken.length) throw new ValidationError(taken);

  const passwordHash = await hashPassword(input.password);
  const { token, hash } = newOneTimeToken();
  let created: { user: AppUser; organizationId: string };
  let welcome: OutboxMail;
  try {
    ({ welcome, ...created } = await db.transaction().execute(async (trx) => {
      const made = await insertCompanyWithOwner(trx, { company: input.company, name: input.name, email: input.email, passwordHash });
      await insertEmailToken(trx, 'email_confirmations', { userId: made.user.id, tokenHash: hash, lifetimeSeconds: CONFIRMATION_LIFETIME_SECONDS });
      await writeAudit(trx, {
        actorUserId: made.user.id,
        action: 'account.sign-up',
        entityType: 'user',
        entityId: made.user.id,
        organizationId: made.organizationId,
        details: { company: input.company, email: made.user.email, address: ctx.address },
      });
      return { ...made, welcome: await queueWelcomeMail(trx, made.user, input.company, token) };
    }));
  } catch (err) {
    // Two sign-ups racing for the same address or company name: the second is told as if it came later.
    if (isUniqueViolation(err, 'users_email_unique')) throw new ValidationError([{ path: 'email', message: EMAIL_TAKEN }]);
    if (isUniqueViolation(err, 'organizations_name_key')) throw new ValidationError([{ path: 'company', message: COMPANY_TAKEN }]);
    throw err;
  }

  await dispatchMail([welcome]);
  return { ...created, welcomeMail: { id: welcome.id, status: welcome.status } };
}
