import 'server-only';
import type { DB } from '@/db';
import { findAccountByEmail, findAccountById, findPasswordHash, markEmailConfirmed, revokeApiTokensOf, revokeSessionsOf, setPassword } from '@/db/accounts';
import { writeAudit } from '@/db/audit';
import { consumeEmailToken, expireOtherEmailTokens, findEmailToken, insertEmailToken } from '@/db/email-tokens';
import type { PasswordChangeInput, PasswordResetInput } from '@/lib/domain/accounts/forms';
import { passwordFieldError } from '@/lib/domain/accounts/password-policy';
import { ConflictError, NotFoundError, ValidationError } from '@/lib/domain/errors';
import type { AppUser } from '@/lib/domain/roles';
import { hashPassword, verifyPassword } from '@/lib/platform/auth/password';
import { forgetCachedCopies } from '@/lib/platform/cache/invalidation';
import { hashOneTimeToken, looksLikeOneTimeToken, newOneTimeToken } from '@/lib/platform/auth/one-time-token';
import { PASSWORD_RESET_LIFETIME_SECONDS, queuePasswordResetMail } from '@/lib/services/accounts/account-mail';
import { dispatchMail } from '@/lib/services/mail/outbox';
import { countPasswordResetRequest } from '@/lib/services/accounts/limits';
import type { TokenLinkState } from '@/lib/services/accounts/email-confirmation';

/** The one answer to every reset request, whether or not the address has an account. */
export const RESET_REQUESTED_BODY = {
  message: 'If this e-mail address has a NookPass account, a link to choose a new password is on its way. The link works for one hour, once.',
} as const;

export const RESET_LINK_MESSAGES: Record<Exclude<TokenLinkState, 'valid'>, string> = {
  unknown: 'This password reset link is not valid. Check that the whole link was copied, or ask for a new one.',
  expired: 'This password reset link has expired (links work for one hour). Ask for a new one.',
  used: 'This password reset link was already used. If you did not choose a new password, ask for a new link.',
};

/**
 * Counts the request, then, only when the address has an active account, stores a token with its queued
 * e-mail. The caller hands the e-mail to the job queue after answering, so the answer and its timing are the same for
 * known and unknown addresses (OWASP Forgot Password Cheat Sheet: consistent response, consistent time).
 */
export async function requestPasswordReset(db: DB, email: string, ctx: { address: string }): Promise<{ deliver: (() => Promise<void>) | null }> {
  await countPasswordResetRequest(email, ctx.address);
  const account = await findAccountByEmail(db, email);
  if (!account || account.deactivatedAt) return { deliver: null };
  const { token, hash } = newOneTimeToken();
  const mail = await db.transaction().execute(async (trx) => {
    await insertEmailToken(trx, 'password_resets', { userId: account.user.id, tokenHash: hash, lifetimeSeconds: PASSWORD_RESET_LIFETIME_SECONDS });
    await writeAudit(trx, {
      actorUserId: null,
      action: 'account.password-reset-requested',
      entityType: 'user',
      entityId: account.user.id,
      organizationId: account.user.organizationId,
      details: { address: ctx.address },
    });
    return queuePasswordResetMail(trx, account.user, token);
  });
  return { deliver: () => dispatchMail([mail]) };
}

export async function passwordResetLinkState(db: DB, token: string): Promise<TokenLinkState> {
  if (!looksLikeOneTimeToken(token)) return 'unknown';
  return (await findEmailToken(db, 'password_resets', hashOneTimeToken(token))).status;
}

function refuseLink(status: Exclude<TokenLinkState, 'valid'>): never {
  if (status === 'unknown') throw new NotFoundError(RESET_LINK_MESSAGES.unknown);
  throw new ConflictError(RESET_LINK_MESSAGES[status]);
}

type Ended = { sessionsEnded: number; tokensRevoked: number };

/**
 * Sets the new password from a reset link: the link is spent, every session of the person ends, and their
 * API tokens are revoked unless they chose to keep them, all in one transaction. The link also proves the
 * address, so an unconfirmed address becomes confirmed.
 */
export async function resetPassword(db: DB, token: string, input: PasswordResetInput): Promise<Ended & { user: AppUser }> {
  if (!looksLikeOneTimeToken(token)) refuseLink('unknown');
  const tokenHash = hashOneTimeToken(token);
  const before = await findEmailToken(db, 'password_resets', tokenHash);
  if (before.status !== 'valid') refuseLink(before.status);
  const account = await findAccountById(db, before.userId);
  if (!account || account.deactivatedAt) refuseLink('unknown');
  const weak = passwordFieldError(input.password, account.user.email);
  if (weak) throw new ValidationError([weak]);
  const passwordHash = await hashPassword(input.password);

  const ended = await db.transaction().execute(async (trx) => {
    // Spent here, not above: of two requests racing with one link, only one gets past this line.
    const state = await consumeEmailToken(trx, 'password_resets', tokenHash);
    if (state.status !== 'valid') refuseLink(state.status);
    await setPassword(trx, account.user.id, passwordHash);
    const sessionsEnded = await revokeSessionsOf(trx, account.user.id, null);
    const tokensRevoked = input.keepApiTokens ? 0 : await revokeApiTokensOf(trx, account.user.id);
    await expireOtherEmailTokens(trx, 'password_resets', account.user.id, state.id);
    const emailConfirmed = await markEmailConfirmed(trx, account.user.id);
    await writeAudit(trx, {
      actorUserId: account.user.id,
      action: 'account.password-reset',
      entityType: 'user',
      entityId: account.user.id,
      organizationId: account.user.organizationId,
      details: { sessionsEnded, tokensRevoked, keptApiTokens: !!input.keepApiTokens, emailConfirmed },
    });
    return { sessionsEnded, tokensRevoked, user: account.user };
  });
  forgetCachedCopies();
  return ended;
}

/**
 * A signed-in person changes their password: the current one is checked, every other session ends (this
 * browser stays signed in), and API tokens are revoked unless they chose to keep them.
 */
export async function changePassword(db: DB, caller: { user: AppUser; sessionId: string }, input: PasswordChangeInput): Promise<Ended> {
  const { user, sessionId } = caller;
  const weak = passwordFieldError(input.password, user.email);
  if (weak) throw new ValidationError([weak]);
  const stored = await findPasswordHash(db, user.id);
  if (!stored || !(await verifyPassword(input.currentPassword, stored))) {
    throw new ValidationError([{ path: 'currentPassword', message: 'That is not your current password.' }]);
  }
  if (input.currentPassword === input.password) {
    throw new ValidationError([{ path: 'password', message: 'Choose a password different from your current one.' }]);
  }
  const passwordHash = await hashPassword(input.password);
  const ended = await db.transaction().execute(async (trx) => {
    await setPassword(trx, user.id, passwordHash);
    const sessionsEnded = await revokeSessionsOf(trx, user.id, sessionId);
    const tokensRevoked = input.keepApiTokens ? 0 : await revokeApiTokensOf(trx, user.id);
    await writeAudit(trx, {
      actorUserId: user.id,
      action: 'account.password-changed',
      entityType: 'user',
      entityId: user.id,
      organizationId: user.organizationId,
      details: { sessionsEnded, tokensRevoked, keptApiTokens: !!input.keepApiTokens },
    });
    return { sessionsEnded, tokensRevoked };
  });
  forgetCachedCopies();
  return ended;
}
