import 'server-only';
import type { DB } from '@/db';
import { writeAudit } from '@/db/audit';
import {
  findInvitationById,
  findInvitationByTokenHash,
  insertInvitation,
  listOpenInvitations,
  lockInvitationByTokenHash,
  markInvitationAccepted,
  markInvitationRevoked,
  revokePendingInvitationsTo,
  type Invitation,
} from '@/db/invitations';
import { findJurisdictionBySlug } from '@/db/jurisdictions';
import { listMailOfInvitations } from '@/db/mail-outbox';
import { findOrganizationById } from '@/db/organizations';
import { emailHasAccount, insertInvitedUser } from '@/db/people';
import { findUserById } from '@/db/users';
import {
  INVITATION_LIFETIME_DAYS,
  invitationState,
  invitedRoleLabels,
  type AcceptInvitationInput,
  type InvitationInput,
  type InvitationState,
} from '@/lib/domain/accounts/people';
import { ConflictError, ForbiddenError, NotFoundError, ValidationError } from '@/lib/domain/errors';
import { mailDeliveryProps, type MailDeliveryProps } from '@/lib/domain/mail/outbox';
import type { AppUser } from '@/lib/domain/roles';
import { passwordFieldError } from '@/lib/domain/accounts/password-policy';
import { hashOneTimeToken, looksLikeOneTimeToken, newOneTimeToken } from '@/lib/platform/auth/one-time-token';
import { hashAtCurrentCost } from '@/lib/platform/auth/password';
import { countInvitation, countInvitationAcceptance } from '@/lib/services/accounts/invitation-limits';
import { dispatchMail, queueMail } from '@/lib/services/mail/outbox';
import { publicBaseUrl } from '@/lib/services/reports/issue';

export const invitationUrl = (token: string) => `${publicBaseUrl()}/invitations/${token}`;

export function existingAccountMessage(email: string): string {
  return `${email} already has a NookPass account. Invitations are for new people; ask them to sign in, or ask an administrator to change that account.`;
}

/** Whose invitations the actor manages: a company's (owners) or the administrators' (inspectors and admins). */
function scopeOf(actor: AppUser): { organizationId: string } | { admins: true } {
  if (actor.role === 'admin') return { admins: true };
  if (actor.role === 'installer' && actor.isOwner && actor.organizationId) return { organizationId: actor.organizationId };
  throw new ForbiddenError('Only a company owner or an administrator can invite people.');
}

/**
 * Sends an invitation. Owners invite installers and owners into their own company; admins invite
 * inspectors (for a jurisdiction) and admins. An address that already has an account is refused. A new
 * invitation replaces a pending one to the same address from the same place, so only the newest link works.
 */
export async function sendInvitation(db: DB, actor: AppUser, input: InvitationInput & { email: string }, from: { address: string }) {
  const scope = scopeOf(actor);
  const role = input.role;
  let organizationId: string | null = null;
  let jurisdictionId: string | null = null;
  let placeName: string;
  if ('organizationId' in scope) {
    if (role !== 'installer' && role !== 'owner') {
      throw new ValidationError([{ path: 'role', message: 'A company owner invites installers and owners; inspectors and administrators are invited by a NookPass administrator.' }]);
    }
    if (input.jurisdiction !== undefined) throw new ValidationError([{ path: 'jurisdiction', message: 'Only an inspector is invited for a jurisdiction.' }]);
    organizationId = scope.organizationId;
    placeName = (await findOrganizationById(db, organizationId))?.name ?? 'your company';
  } else {
    if (role !== 'inspector' && role !== 'admin') {
      throw new ValidationError([{ path: 'role', message: 'Administrators invite inspectors and administrators; installers are invited by their company’s owner.' }]);
    }
    if (role === 'inspector') {
      if (!input.jurisdiction) throw new ValidationError([{ path: 'jurisdiction', message: 'Choose the jurisdiction the inspector works for.' }]);
      const jurisdiction = await findJurisdictionBySlug(db, input.jurisdiction);
      if (!jurisdiction) throw new ValidationError([{ path: 'jurisdiction', message: `There is no jurisdiction "${input.jurisdiction}".` }]);
      jurisdictionId = jurisdiction.id;
      placeName = jurisdiction.name;
    } else {
      if (input.jurisdiction !== undefined) throw new ValidationError([{ path: 'jurisdiction', message: 'Only an inspector is invited for a jurisdiction.' }]);
      placeName = 'NookPass administration';
    }
  }
  const email = input.email;
  if (await emailHasAccount(db, email)) throw new ValidationError([{ path: 'email', message: existingAccountMessage(email) }]);
  await countInvitation(email, from.address);

  const { token, hash } = newOneTimeToken();
  const { view, mail } = await db.transaction().execute(async (trx) => {
    const replaced = await revokePendingInvitationsTo(trx, email, organizationId);
    const created = await insertInvitation(trx, {
      email, role, organizationId, jurisdictionId, invitedBy: actor.id, tokenHash: hash, lifetimeDays: INVITATION_LIFETIME_DAYS,
    });
    await writeAudit(trx, {
      actorUserId: actor.id,
      action: 'invitation.send',
      entityType: 'invitation',
      entityId: created.id,
      details: { email, role, ...(jurisdictionId ? { jurisdictionId } : {}), ...(replaced.length ? { replaced } : {}) },
      organizationId,
    });
    // Queued with the invitation; a job delivers it, and its state shows beside the pending invitation.
    const mail = await queueMail(trx, {
      kind: 'invitation',
      invitationId: created.id,
      createdBy: actor.id,
      to: email,
      subject: `${actor.name} invites you to NookPass (${placeName})`,
      text: [
        `${actor.name} (${actor.email}) invites you to join ${placeName} on NookPass as ${invitedRoleLabels[role].toLowerCase()}.`,
        '',
        `Accept the invitation and choose your password: ${invitationUrl(token)}`,
        '',
        `The link works once and expires in ${INVITATION_LIFETIME_DAYS} days. If you did not expect this, ignore this message.`,
      ].join('\n'),
    });
    const invitation = await findInvitationById(trx, created.id);
    return { view: toView(invitation!), mail };
  });
  await dispatchMail([mail]);
  return { ...view, mail: mailSummary(mail) };
}

/** What the people page shows of an invitation's e-mail. */
export type InvitationMail = MailDeliveryProps;
const mailSummary = mailDeliveryProps;

export type InvitationView = {
  id: string;
  email: string;
  role: Invitation['role'];
  state: InvitationState;
  organizationName: string | null;
  jurisdictionName: string | null;
  invitedByEmail: string | null;
  createdAt: Date;
  expiresAt: Date;
  mail?: InvitationMail | null;
};

function toView(i: Invitation): InvitationView {
  return {
    id: i.id,
    email: i.email,
    role: i.role,
    state: invitationState(i),
    organizationName: i.organizationName,
    jurisdictionName: i.jurisdictionName,
    invitedByEmail: i.invitedByEmail,
    createdAt: i.createdAt,
    expiresAt: i.expiresAt,
  };
}

/** Invitations not yet accepted or revoked, sent from where the actor manages people. */
export async function listPendingInvitations(db: DB, actor: AppUser): Promise<InvitationView[]> {
  const open = await listOpenInvitations(db, scopeOf(actor));
  const mails = new Map((await listMailOfInvitations(db, open.map((i) => i.id))).map((m) => [m.invitationId, m]));
  return open.map((i) => {
    const mail = mails.get(i.id);
    return { ...toView(i), mail: mail ? mailSummary(mail) : null };
  });
}

/** Withdraws a pending invitation sent from the actor's company (owners) or by the administrators. */
export async function revokeInvitation(db: DB, actor: AppUser, id: string): Promise<InvitationView> {
  const scope = scopeOf(actor);
  return db.transaction().execute(async (trx) => {
    const found = await findInvitationById(trx, id);
    const mine = found && ('organizationId' in scope ? found.organizationId === scope.organizationId : found.organizationId === null);
    if (!found || !mine) throw new NotFoundError('No such invitation was sent from here.');
    const state = invitationState(found);
    if (state === 'accepted') throw new ConflictError(`The invitation to ${found.email} was already accepted; deactivate the account instead.`);
    if (state === 'revoked') throw new ConflictError(`The invitation to ${found.email} was already revoked.`);
    await markInvitationRevoked(trx, id);
    await writeAudit(trx, {
      actorUserId: actor.id,
      action: 'invitation.revoke',
      entityType: 'invitation',
      entityId: id,
      details: { email: found.email, role: found.role },
      organizationId: found.organizationId,
    });
    return toView((await findInvitationById(trx, id))!);
  });
}

/** What the invitation page shows for a link: null for a token that names no invitation. */
export async function describeInvitation(db: DB, token: string): Promise<InvitationView | null> {
  if (!looksLikeOneTimeToken(token)) return null;
  const found = await findInvitationByTokenHash(db, hashOneTimeToken(token));
  return found ? toView(found) : null;
}

/** Thrown when a link can no longer be used; the route answers 409 naming the state. */
export class InvitationUnusableError extends ConflictError {
  constructor(public readonly state: Exclude<InvitationState, 'pending'>, message: string) {
    super(message);
  }
}

const unusable: Record<Exclude<InvitationState, 'pending'>, string> = {
  accepted: 'This invitation has already been used. Sign in with the e-mail address it was sent to.',
  revoked: 'This invitation was revoked. Ask the person who invited you for a new one.',
  expired: `This invitation has expired (invitations work for ${INVITATION_LIFETIME_DAYS} days). Ask the person who invited you for a new one.`,
};

/**
 * Accepts an invitation: the account is created and the invitation marked used in one transaction, with the
 * invitation's row locked, so a link works exactly once. Returns the new person, ready to be signed in.
 */
export async function acceptInvitation(db: DB, token: string, input: AcceptInvitationInput & { name: string; password: string }, from: { address: string }): Promise<AppUser> {
  await countInvitationAcceptance(from.address);
  if (!looksLikeOneTimeToken(token)) throw new NotFoundError('This invitation link is not valid. Check that the whole link was copied.');
  const tokenHash = hashOneTimeToken(token);
  const peek = await findInvitationByTokenHash(db, tokenHash);
  if (!peek) throw new NotFoundError('This invitation link is not valid. Check that the whole link was copied.');
  const weak = passwordFieldError(input.password, peek.email);
  if (weak) throw new ValidationError([weak]);
  const passwordHash = await hashAtCurrentCost(input.password);

  const userId = await db.transaction().execute(async (trx) => {
    const invitation = await lockInvitationByTokenHash(trx, tokenHash);
    if (!invitation) throw new NotFoundError('This invitation link is not valid.');
    const state: InvitationState = invitation.acceptedAt ? 'accepted' : invitation.revokedAt ? 'revoked' : invitation.isExpired ? 'expired' : 'pending';
    if (state !== 'pending') throw new InvitationUnusableError(state, unusable[state]);
    if (await emailHasAccount(trx, invitation.email)) {
      throw new ConflictError(existingAccountMessage(invitation.email));
    }
    const company = invitation.role === 'installer' || invitation.role === 'owner';
    const id = await insertInvitedUser(trx, {
      email: invitation.email,
      name: input.name,
      passwordHash,
      role: company ? 'installer' : invitation.role === 'inspector' ? 'inspector' : 'admin',
      isOwner: invitation.role === 'owner',
      organizationId: company ? invitation.organizationId : null,
      jurisdictionId: invitation.role === 'inspector' ? invitation.jurisdictionId : null,
    });
    await markInvitationAccepted(trx, invitation.id, id);
    await writeAudit(trx, {
      actorUserId: id,
      action: 'invitation.accept',
      entityType: 'invitation',
      entityId: invitation.id,
      details: { email: invitation.email, role: invitation.role, userId: id },
      organizationId: invitation.organizationId,
    });
    return id;
  });
  return (await findUserById(db, userId))!;
}
