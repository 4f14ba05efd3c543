import { sql } from 'kysely';
import type { DB } from '@/db/index';

export type AuditEntry = {
  actorUserId: string | null;
  action: string;
  entityType: string;
  entityId?: string | null;
  details?: Record<string, unknown>;
  /** The company whose owners may read the row (account events of its people). */
  organizationId?: string | null;
};

export async function writeAudit(db: DB, entry: AuditEntry): Promise<void> {
  await db
    .insertInto('audit_log')
    .values({
      actor_user_id: entry.actorUserId,
      action: entry.action,
      entity_type: entry.entityType,
      entity_id: entry.entityId ?? null,
      details: JSON.stringify(entry.details ?? {}),
      // Named only when given, so rows written by code that predates the column still insert (migration tests replay old schemas).
      ...(entry.organizationId !== undefined ? { organization_id: entry.organizationId } : {}),
    })
    .execute();
}

export type AuditItem = { id: number; at: Date; action: string; actorEmail: string | null; entityId: string | null; details: Record<string, unknown> };

/** The audit trail of one jurisdiction: its own edits and everything done to its rule set versions. */
export async function listJurisdictionAudit(db: DB, jurisdictionId: string, limit = 100): Promise<AuditItem[]> {
  const rows = await db
    .selectFrom('audit_log as a')
    .leftJoin('users as u', 'u.id', 'a.actor_user_id')
    .select(['a.id', 'a.at', 'a.action', 'a.entity_id', 'a.details', 'u.email'])
    .where((eb) =>
      eb.or([
        eb(sql<string>`a.details->>'jurisdictionId'`, '=', jurisdictionId),
        eb.and([eb('a.entity_type', '=', 'jurisdiction'), eb('a.entity_id', '=', jurisdictionId)]),
      ]),
    )
    .where('a.entity_type', 'in', ['jurisdiction', 'rule_set'])
    .orderBy('a.id', 'desc')
    .limit(limit)
    .execute();
  return rows.map((r) => ({ id: r.id, at: r.at, action: r.action, actorEmail: r.email, entityId: r.entity_id, details: r.details }));
}
