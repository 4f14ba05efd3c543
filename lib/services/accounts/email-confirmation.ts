import 'server-only';
import type { DB } from '@/db';
import { findAccountById, isEmailConfirmed, markEmailConfirmed } from '@/db/accounts';
import { writeAudit } from '@/db/audit';
import { consumeEmailToken, expireOtherEmailTokens, findEmailToken, insertEmailToken, type EmailTokenState } from '@/db/email-tokens';
import { ConflictError, ForbiddenError, NotFoundError } from '@/lib/domain/errors';
import type { AppUser } from '@/lib/domain/roles';
import { hashOneTimeToken, looksLikeOneTimeToken, newOneTimeToken } from '@/lib/platform/auth/one-time-token';
import { CONFIRMATION_LIFETIME_SECONDS, queueConfirmationMail } from '@/lib/services/accounts/account-mail';
import { dispatchMail } from '@/lib/services/mail/outbox';
import type { MailStatus } from '@/lib/domain/mail/outbox';
import { countConfirmationRequest } from '@/lib/services/accounts/limits';

export const UNCONFIRMED_SEND_MESSAGE =
  'Confirm your e-mail address before sending reports to inspectors: open the link in the welcome e-mail, or send a new link from the report page or the Account page. Everything else works already.';

export type TokenLinkState = EmailTokenState['status'];

/** What a confirmation link is now, for the page it opens; a malformed token is 'unknown'. */
export async function confirmationLinkState(db: DB, token: string): Promise<TokenLinkState> {
  if (!looksLikeOneTimeToken(token)) return 'unknown';
  return (await findEmailToken(db, 'email_confirmations', hashOneTimeToken(token))).status;
}

/** Confirms the address the link was sent to; the token is spent in the same transaction. */
export async function confirmEmail(db: DB, token: string): Promise<{ status: TokenLinkState }> {
  if (!looksLikeOneTimeToken(token)) return { status: 'unknown' };
  return db.transaction().execute(async (trx) => {
    const state = await consumeEmailToken(trx, 'email_confirmations', hashOneTimeToken(token));
    if (state.status !== 'valid') return { status: state.status };
    const account = await findAccountById(trx, state.userId);
    if (!account) return { status: 'unknown' as const };
    if (await markEmailConfirmed(trx, state.userId)) {
      await writeAudit(trx, {
        actorUserId: state.userId,
        action: 'account.email-confirmed',
        entityType: 'user',
        entityId: state.userId,
        organizationId: account.user.organizationId,
        details: { email: account.user.email },
      });
    }
    await expireOtherEmailTokens(trx, 'email_confirmations', state.userId, state.id);
    return { status: 'valid' as const };
  });
}

/** Sends a fresh confirmation link to the signed-in person (older links stop working). */
export async function resendConfirmation(db: DB, user: AppUser, ctx: { address: string }): Promise<{ sentTo: string; mail: { id: string; status: MailStatus } }> {
  const account = await findAccountById(db, user.id);
  if (!account) throw new NotFoundError('Your account was not found.');
  if (account.emailConfirmedAt) throw new ConflictError('Your e-mail address is already confirmed.');
  // Counted only when a message would go out: an already confirmed address sends nothing.
  await countConfirmationRequest(account.user.email, ctx.address);
  const { token, hash } = newOneTimeToken();
  const mail = await db.transaction().execute(async (trx) => {
    await expireOtherEmailTokens(trx, 'email_confirmations', user.id);
    await insertEmailToken(trx, 'email_confirmations', { userId: user.id, tokenHash: hash, lifetimeSeconds: CONFIRMATION_LIFETIME_SECONDS });
    return queueConfirmationMail(trx, account.user, token);
  });
  await dispatchMail([mail]);
  return { sentTo: account.user.email, mail: { id: mail.id, status: mail.status } };
}

/** Reports reach inspectors only from a confirmed address; throws a 403 that says what to do otherwise. */
export async function assertMaySendToInspectors(db: DB, user: AppUser): Promise<void> {
  if (!(await isEmailConfirmed(db, user.id))) throw new ForbiddenError(UNCONFIRMED_SEND_MESSAGE);
}
