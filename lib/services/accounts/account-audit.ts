import 'server-only';
import type { DB } from '@/db';
import { listAuditActions, listAuditRows, type AuditRow } from '@/db/account-audit';
import type { AuditFilterInput } from '@/lib/domain/accounts/people';
import { ForbiddenError, ValidationError } from '@/lib/domain/errors';
import type { AppUser } from '@/lib/domain/roles';

/** Whose audit rows the actor reads: administrators everything, a company's owners their company's. */
function readableScope(actor: AppUser): { organizationId?: string } {
  if (actor.role === 'admin') return {};
  if (actor.role === 'installer' && actor.isOwner && actor.organizationId) return { organizationId: actor.organizationId };
  throw new ForbiddenError('Only administrators and company owners read the audit log.');
}

const nextDay = (isoDay: string) => new Date(Date.parse(`${isoDay}T00:00:00Z`) + 24 * 3600_000);

/** Audit rows the actor may read, filtered by action, person and a date range (whole UTC days, both ends included). */
export async function readAudit(db: DB, actor: AppUser, filter: AuditFilterInput): Promise<{ rows: AuditRow[]; actions: string[] }> {
  const scope = readableScope(actor);
  const from = filter.from ? new Date(`${filter.from}T00:00:00Z`) : undefined;
  const to = filter.to ? nextDay(filter.to) : undefined;
  if (from && to && from >= to) throw new ValidationError([{ path: 'to', message: 'The end date comes before the start date.' }]);
  const [rows, actions] = await Promise.all([
    listAuditRows(db, { ...scope, action: filter.action, person: filter.person, from, to, limit: filter.limit }),
    listAuditActions(db, scope.organizationId),
  ]);
  return { rows, actions };
}
