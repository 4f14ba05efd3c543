import 'server-only';
import type { DB } from '@/db';
import { writeAudit } from '@/db/audit';
import { findJurisdictionBySlug } from '@/db/jurisdictions';
import {
  countOtherActiveAdmins,
  countOtherActiveOwners,
  deactivatePerson,
  findPerson,
  listPeople,
  lockForPeopleChange,
  reactivatePerson,
  setJurisdiction,
  setOwner,
  type PeopleFilter,
  type Person,
} from '@/db/people';
import type { PersonUpdate } from '@/lib/domain/accounts/people';
import { ConflictError, ForbiddenError, NotFoundError, ValidationError } from '@/lib/domain/errors';
import type { AppUser } from '@/lib/domain/roles';
import { forgetCachedCopies } from '@/lib/platform/cache/invalidation';

/** The company the actor owns; anyone else is refused. */
export function ownedCompany(actor: AppUser): string {
  if (actor.role !== 'installer' || !actor.isOwner || !actor.organizationId) {
    throw new ForbiddenError('Only an owner of the company manages its people.');
  }
  return actor.organizationId;
}

/** The people of the owner's company, deactivated ones included (their records stay). */
export async function listCompanyMembers(db: DB, actor: AppUser): Promise<Person[]> {
  return listPeople(db, { organizationId: ownedCompany(actor) });
}

/** Everyone, for administrators, with the people page's search and filters. */
export async function listAllPeople(db: DB, actor: AppUser, filter: Omit<PeopleFilter, 'organizationId'>): Promise<Person[]> {
  if (actor.role !== 'admin') throw new ForbiddenError();
  return listPeople(db, filter);
}

/**
 * Changes one person: an owner within their own company (installer ↔ owner, deactivate, reactivate); an
 * administrator anyone (and an inspector's jurisdiction). A company always keeps an active owner and
 * NookPass an active administrator; nobody deactivates themselves. Each change is audited.
 */
export async function updatePerson(db: DB, actor: AppUser, personId: string, change: PersonUpdate): Promise<Person> {
  const company = actor.role === 'admin' ? null : ownedCompany(actor);
  const after = await db.transaction().execute(async (trx) => {
    const before = await findPerson(trx, personId);
    // Another company's people answer as if they did not exist.
    if (!before || (company !== null && before.organizationId !== company)) throw new NotFoundError('No such person in your company.');
    await lockForPeopleChange(trx, before);
    const person = (await findPerson(trx, personId))!;
    const audit = (action: string, details: Record<string, unknown>) =>
      writeAudit(trx, {
        actorUserId: actor.id,
        action,
        entityType: 'user',
        entityId: person.id,
        details: { email: person.email, ...details },
        organizationId: person.organizationId,
      });

    if (change.role !== undefined) {
      if (person.role !== 'installer') {
        throw new ValidationError([{ path: 'role', message: `${person.name} is ${person.role === 'admin' ? 'an administrator' : 'an inspector'}; only a company's installers can be made owners.` }]);
      }
      const makeOwner = change.role === 'owner';
      if (makeOwner !== person.isOwner) {
        if (!makeOwner && person.organizationId && (await countOtherActiveOwners(trx, person.organizationId, person.id)) === 0) {
          throw new ConflictError(`${person.name} is the company's only active owner. Make someone else an owner first.`);
        }
        await setOwner(trx, person.id, makeOwner);
        await audit('user.role-change', { from: person.isOwner ? 'owner' : 'installer', to: change.role });
      }
    }

    if (change.jurisdiction !== undefined) {
      if (actor.role !== 'admin') throw new ForbiddenError('Only an administrator changes an inspector’s jurisdiction.');
      if (person.role !== 'inspector') throw new ValidationError([{ path: 'jurisdiction', message: `${person.name} is not an inspector; only inspectors work for a jurisdiction.` }]);
      const jurisdiction = await findJurisdictionBySlug(trx, change.jurisdiction);
      if (!jurisdiction) throw new ValidationError([{ path: 'jurisdiction', message: `There is no jurisdiction "${change.jurisdiction}".` }]);
      if (jurisdiction.id !== person.jurisdictionId) {
        await setJurisdiction(trx, person.id, jurisdiction.id);
        await audit('user.jurisdiction-change', { from: person.jurisdictionId, to: jurisdiction.id, jurisdictionName: jurisdiction.name });
      }
    }

    if (change.active !== undefined) {
      const isActive = person.deactivatedAt === null;
      if (change.active === false && isActive) {
        if (person.id === actor.id) throw new ConflictError('You cannot deactivate yourself; ask another owner or an administrator.');
        const afterRole = (await findPerson(trx, person.id))!;
        if (afterRole.isOwner && afterRole.organizationId && (await countOtherActiveOwners(trx, afterRole.organizationId, person.id)) === 0) {
          throw new ConflictError(`${person.name} is the company's only active owner and cannot be deactivated. Make someone else an owner first.`);
        }
        if (person.role === 'admin' && (await countOtherActiveAdmins(trx, person.id)) === 0) {
          throw new ConflictError(`${person.name} is the only active administrator and cannot be deactivated.`);
        }
        const ended = await deactivatePerson(trx, person.id);
        await audit('user.deactivate', ended);
      } else if (change.active === true && !isActive) {
        await reactivatePerson(trx, person.id);
        await audit('user.reactivate', {});
      }
    }
    return (await findPerson(trx, person.id))!;
  });
  // A role, a jurisdiction or a deactivation changes what this person's sessions and tokens may do.
  forgetCachedCopies();
  return after;
}
