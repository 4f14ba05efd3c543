import { sql } from 'kysely';
import type { DB } from '@/db/index';

export type AuditFilter = {
  /** Only rows a company's owners may read. */
  organizationId?: string;
  action?: string;
  /** Part of the e-mail or name of whoever acted, or of the e-mail the event is about. */
  person?: string;
  from?: Date;
  /** Exclusive. */
  to?: Date;
  limit: number;
};

export type AuditRow = {
  id: number;
  at: Date;
  action: string;
  entityType: string;
  entityId: string | null;
  details: Record<string, unknown>;
  actorEmail: string | null;
  actorName: string | null;
  organizationName: string | null;
};

const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

export async function listAuditRows(db: DB, filter: AuditFilter): Promise<AuditRow[]> {
  let q = db
    .selectFrom('audit_log as a')
    .leftJoin('users as u', 'u.id', 'a.actor_user_id')
    .leftJoin('organizations as o', 'o.id', 'a.organization_id')
    .select(['a.id', 'a.at', 'a.action', 'a.entity_type', 'a.entity_id', 'a.details', 'u.email as actor_email', 'u.name as actor_name', 'o.name as organization_name']);
  if (filter.organizationId) q = q.where('a.organization_id', '=', filter.organizationId);
  if (filter.action) q = q.where('a.action', '=', filter.action);
  if (filter.from) q = q.where('a.at', '>=', filter.from);
  if (filter.to) q = q.where('a.at', '<', filter.to);
  if (filter.person) {
    const pattern = `%${escapeLike(filter.person)}%`;
    q = q.where((eb) =>
      eb.or([eb('u.email', 'ilike', pattern), eb('u.name', 'ilike', pattern), eb(sql<string>`a.details->>'email'`, 'ilike', pattern)]),
    );
  }
  const rows = await q.orderBy('a.id', 'desc').limit(filter.limit).execute();
  return rows.map((r) => ({
    id: r.id,
    at: r.at,
    action: r.action,
    entityType: r.entity_type,
    entityId: r.entity_id,
    details: r.details,
    actorEmail: r.actor_email,
    actorName: r.actor_name,
    organizationName: r.organization_name,
  }));
}

/** The actions that occur in the rows the reader may see, for the filter's choices. */
export async function listAuditActions(db: DB, organizationId?: string): Promise<string[]> {
  let q = db.selectFrom('audit_log').select('action').distinct();
  if (organizationId) q = q.where('organization_id', '=', organizationId);
  const rows = await q.orderBy('action').limit(200).execute();
  return rows.map((r) => r.action);
}
