import { sql, type Selectable } from 'kysely';
import type { DB } from '@/db/index';
import { listOverdueOutboxRows } from '@/db/outbox-rows';
import type { WebhookDeliveriesTable, WebhookEndpointsTable } from '@/db/types';
import { isUuid } from '@/lib/domain/ids';
import type { WebhookDeliveryStatus, WebhookEventType } from '@/lib/domain/webhooks/events';

/** An endpoint as pages and the API show it: never its secret. */
export type WebhookEndpoint = {
  id: string;
  organizationId: string;
  url: string;
  events: WebhookEventType[];
  isActive: boolean;
  secretRotatedAt: Date | null;
  createdBy: { id: string; name: string } | null;
  createdAt: Date;
  updatedAt: Date;
};

export type WebhookDelivery = {
  id: string;
  endpointId: string;
  organizationId: string;
  eventId: string;
  eventType: WebhookEventType;
  status: WebhookDeliveryStatus;
  attempts: number;
  maxAttempts: number;
  lastResponseStatus: number | null;
  lastError: string | null;
  nextAttemptAt: Date;
  deliveredAt: Date | null;
  createdAt: Date;
  updatedAt: Date;
};

/** What the worker needs for one attempt: where, with which secret, which bytes. */
export type ClaimedWebhookDelivery = WebhookDelivery & { url: string; secret: string; endpointActive: boolean; payload: unknown };

type EndpointRow = Selectable<WebhookEndpointsTable> & { creator_name: string | null };

function toEndpoint(r: EndpointRow): WebhookEndpoint {
  return {
    id: r.id,
    organizationId: r.organization_id,
    url: r.url,
    events: r.events,
    isActive: r.is_active,
    secretRotatedAt: r.secret_rotated_at,
    createdBy: r.created_by ? { id: r.created_by, name: r.creator_name ?? '' } : null,
    createdAt: r.created_at,
    updatedAt: r.updated_at,
  };
}

function toDelivery(r: Selectable<WebhookDeliveriesTable> & { organization_id: string }): WebhookDelivery {
  return {
    id: r.id,
    endpointId: r.endpoint_id,
    organizationId: r.organization_id,
    eventId: r.event_id,
    eventType: r.event_type,
    status: r.status,
    attempts: r.attempts,
    maxAttempts: r.max_attempts,
    lastResponseStatus: r.last_response_status,
    lastError: r.last_error,
    nextAttemptAt: r.next_attempt_at,
    deliveredAt: r.delivered_at,
    createdAt: r.created_at,
    updatedAt: r.updated_at,
  };
}

function endpoints(db: DB) {
  return db.selectFrom('webhook_endpoints as e').leftJoin('users as u', 'u.id', 'e.created_by').selectAll('e').select('u.name as creator_name');
}

function deliveries(db: DB) {
  return db.selectFrom('webhook_deliveries as d').innerJoin('webhook_endpoints as e', 'e.id', 'd.endpoint_id').selectAll('d').select('e.organization_id');
}

export async function listWebhookEndpoints(db: DB, organizationId: string): Promise<WebhookEndpoint[]> {
  const rows = await endpoints(db).where('e.organization_id', '=', organizationId).orderBy('e.created_at').orderBy('e.id').execute();
  return rows.map(toEndpoint);
}

/** One endpoint of one company; another company's answers null, as a missing one does. */
export async function findWebhookEndpoint(db: DB, organizationId: string, id: string): Promise<WebhookEndpoint | null> {
  if (!isUuid(id)) return null;
  const row = await endpoints(db).where('e.id', '=', id).where('e.organization_id', '=', organizationId).executeTakeFirst();
  return row ? toEndpoint(row) : null;
}

/** Serializes changes to a company's set of endpoints (by its organization row) until the transaction ends. */
export async function lockCompanyWebhooks(trx: DB, organizationId: string): Promise<void> {
  await trx.selectFrom('organizations').select('id').where('id', '=', organizationId).forNoKeyUpdate().execute();
}

/** The company's active endpoints (deactivated ones only keep their history). */
export async function countActiveWebhookEndpoints(db: DB, organizationId: string): Promise<number> {
  const row = await db
    .selectFrom('webhook_endpoints')
    .select((eb) => eb.fn.countAll<number>().as('n'))
    .where('organization_id', '=', organizationId)
    .where('is_active', '=', true)
    .executeTakeFirstOrThrow();
  return Number(row.n);
}

export async function insertWebhookEndpoint(
  db: DB,
  e: { organizationId: string; url: string; events: WebhookEventType[]; secret: string; createdBy: string },
): Promise<string> {
  const row = await db
    .insertInto('webhook_endpoints')
    .values({ organization_id: e.organizationId, url: e.url, events: e.events, secret: e.secret, created_by: e.createdBy })
    .returning('id')
    .executeTakeFirstOrThrow();
  return row.id;
}

export async function updateWebhookEndpoint(
  db: DB,
  organizationId: string,
  id: string,
  change: { url?: string; events?: WebhookEventType[]; isActive?: boolean },
): Promise<boolean> {
  const result = await db
    .updateTable('webhook_endpoints')
    .set({
      ...(change.url !== undefined ? { url: change.url } : {}),
      ...(change.events !== undefined ? { events: change.events } : {}),
      ...(change.isActive !== undefined ? { is_active: change.isActive } : {}),
      updated_at: sql<Date>`now()`,
    })
    .where('id', '=', id)
    .where('organization_id', '=', organizationId)
    .executeTakeFirst();
  return Number(result.numUpdatedRows) === 1;
}

export async function setWebhookSecret(db: DB, organizationId: string, id: string, secret: string): Promise<boolean> {
  const result = await db
    .updateTable('webhook_endpoints')
    .set({ secret, secret_rotated_at: sql<Date>`now()`, updated_at: sql<Date>`now()` })
    .where('id', '=', id)
    .where('organization_id', '=', organizationId)
    .executeTakeFirst();
  return Number(result.numUpdatedRows) === 1;
}

/**
 * Removes an endpoint that never had a delivery. Returns false when it has some (the caller deactivates it
 * instead); the delivery rows keep the endpoint by foreign key, so a delivery racing in makes this fail, not vanish.
 */
export async function deleteWebhookEndpointWithoutDeliveries(db: DB, organizationId: string, id: string): Promise<boolean> {
  const result = await db
    .deleteFrom('webhook_endpoints')
    .where('id', '=', id)
    .where('organization_id', '=', organizationId)
    .where((eb) => eb.not(eb.exists(eb.selectFrom('webhook_deliveries').select(sql`1`.as('x')).whereRef('webhook_deliveries.endpoint_id', '=', 'webhook_endpoints.id'))))
    .executeTakeFirst();
  return Number(result.numDeletedRows) === 1;
}

/** The company's active endpoints subscribed to the event, locked so a rotation or deactivation waits for the change. */
export async function listSubscribedEndpointIds(db: DB, organizationId: string, eventType: WebhookEventType): Promise<string[]> {
  const rows = await db
    .selectFrom('webhook_endpoints')
    .select('id')
    .where('organization_id', '=', organizationId)
    .where('is_active', '=', true)
    .where(sql<boolean>`${eventType} = ANY(events)`)
    .forShare()
    .execute();
  return rows.map((r) => r.id);
}

/** Records one delivery per endpoint; an event already recorded for an endpoint is left as it is. */
export async function insertWebhookDeliveries(
  db: DB,
  rows: Array<{ endpointId: string; eventId: string; eventType: WebhookEventType; payload: unknown; maxAttempts: number }>,
): Promise<string[]> {
  if (rows.length === 0) return [];
  const inserted = await db
    .insertInto('webhook_deliveries')
    .values(rows.map((r) => ({ endpoint_id: r.endpointId, event_id: r.eventId, event_type: r.eventType, payload: JSON.stringify(r.payload), max_attempts: r.maxAttempts })))
    .onConflict((oc) => oc.columns(['endpoint_id', 'event_id']).doNothing())
    .returning('id')
    .execute();
  return inserted.map((r) => r.id);
}

export async function findWebhookDelivery(db: DB, id: string): Promise<WebhookDelivery | null> {
  if (!isUuid(id)) return null;
  const row = await deliveries(db).where('d.id', '=', id).executeTakeFirst();
  return row ? toDelivery(row) : null;
}

/** The latest deliveries of one endpoint, newest first. */
export async function listWebhookDeliveries(db: DB, endpointId: string, limit: number): Promise<WebhookDelivery[]> {
  const rows = await deliveries(db).where('d.endpoint_id', '=', endpointId).orderBy('d.created_at', 'desc').orderBy('d.id', 'desc').limit(limit).execute();
  return rows.map(toDelivery);
}

/** The latest deliveries of each of the company's endpoints (`perEndpoint` each), newest first. */
export async function listRecentWebhookDeliveries(db: DB, organizationId: string, perEndpoint: number): Promise<WebhookDelivery[]> {
  const rows = await db
    .selectFrom('webhook_endpoints as e')
    .innerJoinLateral(
      (eb) => eb.selectFrom('webhook_deliveries as d').selectAll('d').whereRef('d.endpoint_id', '=', 'e.id').orderBy('d.created_at', 'desc').orderBy('d.id', 'desc').limit(perEndpoint).as('d'),
      (join) => join.onTrue(),
    )
    .selectAll('d')
    .select('e.organization_id')
    .where('e.organization_id', '=', organizationId)
    .orderBy('d.created_at', 'desc')
    .execute();
  return rows.map(toDelivery);
}

/**
 * Takes the delivery for one attempt. Only one caller wins: the row must be waiting (queued or retrying), or
 * claimed so long ago that its worker must have died. Anyone else gets null and posts nothing.
 */
export async function claimWebhookDelivery(db: DB, id: string, staleClaimSeconds: number): Promise<ClaimedWebhookDelivery | null> {
  return db.transaction().execute(async (trx) => {
    const claimed = await trx
      .updateTable('webhook_deliveries')
      .set({ status: 'sending', attempts: sql<number>`attempts + 1`, claimed_at: sql<Date>`now()`, updated_at: sql<Date>`now()` })
      .where('id', '=', id)
      .where((eb) =>
        eb.or([
          eb('status', 'in', ['queued', 'retrying']),
          eb.and([eb('status', '=', 'sending'), eb('claimed_at', '<', sql<Date>`now() - make_interval(secs => ${staleClaimSeconds})`)]),
        ]),
      )
      .returning('id')
      .executeTakeFirst();
    if (!claimed) return null;
    const row = await trx
      .selectFrom('webhook_deliveries as d')
      .innerJoin('webhook_endpoints as e', 'e.id', 'd.endpoint_id')
      .selectAll('d')
      .select(['e.organization_id', 'e.url', 'e.secret', 'e.is_active'])
      .where('d.id', '=', id)
      .executeTakeFirstOrThrow();
    return { ...toDelivery(row), url: row.url, secret: row.secret, endpointActive: row.is_active, payload: row.payload };
  });
}

export async function markWebhookDelivered(db: DB, id: string, responseStatus: number): Promise<void> {
  await db
    .updateTable('webhook_deliveries')
    .set({ status: 'delivered', last_response_status: responseStatus, last_error: null, delivered_at: sql<Date>`now()`, claimed_at: null, updated_at: sql<Date>`now()` })
    .where('id', '=', id)
    .where('status', '=', 'sending')
    .execute();
}

/**
 * Records a failed attempt: "retrying" while attempts remain (retryAfterSeconds is the latest the next one is
 * due), "failed" after the last or when `final`. Returns the status written.
 */
export async function markWebhookAttemptFailed(
  db: DB,
  id: string,
  failure: { responseStatus: number | null; error: string; retryAfterSeconds: number; final: boolean },
): Promise<'retrying' | 'failed' | null> {
  const row = await db
    .updateTable('webhook_deliveries')
    .set({
      status: failure.final ? 'failed' : sql<'retrying' | 'failed'>`CASE WHEN attempts >= max_attempts THEN 'failed' ELSE 'retrying' END`,
      last_response_status: failure.responseStatus,
      last_error: failure.error.slice(0, 500),
      claimed_at: null,
      next_attempt_at: sql<Date>`now() + make_interval(secs => ${failure.retryAfterSeconds})`,
      updated_at: sql<Date>`now()`,
    })
    .where('id', '=', id)
    .where('status', '=', 'sending')
    .returning('status')
    .executeTakeFirst();
  return (row?.status as 'retrying' | 'failed' | undefined) ?? null;
}

/** Puts a delivery that failed its last attempt back in the queue with a fresh set of attempts. */
export async function requeueFailedWebhookDelivery(db: DB, id: string, maxAttempts: number): Promise<WebhookDelivery | null> {
  const row = await db
    .updateTable('webhook_deliveries')
    .set({ status: 'queued', attempts: 0, max_attempts: maxAttempts, next_attempt_at: sql<Date>`now()`, claimed_at: null, updated_at: sql<Date>`now()` })
    .where('id', '=', id)
    .where('status', '=', 'failed')
    .returning('id')
    .executeTakeFirst();
  return row ? findWebhookDelivery(db, row.id) : null;
}

/** Deliveries whose job must have been lost (see listOverdueOutboxRows). */
export function listOverdueWebhookDeliveries(db: DB, graceSeconds: number, staleClaimSeconds: number, limit: number): Promise<string[]> {
  return listOverdueOutboxRows(db, 'webhook_deliveries', graceSeconds, staleClaimSeconds, limit);
}

/** The project facts an event names: its company (whose endpoints hear it), name and jurisdiction. */
export async function findProjectEventContext(db: DB, projectId: string): Promise<{ organizationId: string; name: string; jurisdiction: { slug: string; name: string } } | null> {
  const row = await db
    .selectFrom('projects as p')
    .innerJoin('jurisdictions as j', 'j.id', 'p.jurisdiction_id')
    .select(['p.organization_id', 'p.name', 'j.slug', 'j.name as jurisdiction_name'])
    .where('p.id', '=', projectId)
    .executeTakeFirst();
  return row ? { organizationId: row.organization_id, name: row.name, jurisdiction: { slug: row.slug, name: row.jurisdiction_name } } : null;
}
