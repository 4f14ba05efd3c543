import 'server-only';
import { randomBytes } from 'node:crypto';
import type { DB } from '@/db';
import { writeAudit } from '@/db/audit';
import {
  countActiveWebhookEndpoints,
  deleteWebhookEndpointWithoutDeliveries,
  findWebhookDelivery,
  findWebhookEndpoint,
  insertWebhookEndpoint,
  lockCompanyWebhooks,
  listRecentWebhookDeliveries,
  listWebhookDeliveries,
  listWebhookEndpoints,
  requeueFailedWebhookDelivery,
  setWebhookSecret,
  updateWebhookEndpoint,
  type WebhookDelivery,
  type WebhookEndpoint,
} from '@/db/webhooks';
import { ConflictError, ForbiddenError, NotFoundError, ValidationError } from '@/lib/domain/errors';
import type { AppUser } from '@/lib/domain/roles';
import { webhookDeliveryState } from '@/lib/domain/webhooks/events';
import { MAX_WEBHOOK_ENDPOINTS, type WebhookCreateOutput, type WebhookUpdateInput } from '@/lib/domain/webhooks/schema';
import { webhookTargetProblem } from '@/lib/platform/webhooks/targets';
import { dispatchWebhookDeliveries, webhookDeliveryConfig } from '@/lib/services/webhooks/deliveries';

/*
 * A company's webhooks follow its settings: every installer of the company may read them (endpoints and
 * deliveries, never a secret); only its owners add, change, rotate, remove and send again, as with people.
 * Another company's endpoint or delivery answers 404, as a missing one does.
 */

export const WEBHOOK_OWNERS_ONLY = 'Only an owner of the company manages its webhooks.';
const NO_SUCH_ENDPOINT = 'No such webhook endpoint in your company.';
const NO_SUCH_DELIVERY = 'No such webhook delivery in your company.';

function readerCompany(actor: AppUser): string {
  if (actor.role !== 'installer' || !actor.organizationId) throw new ForbiddenError('Webhooks belong to installer companies.');
  return actor.organizationId;
}

function ownerCompany(actor: AppUser): string {
  const company = readerCompany(actor);
  if (!actor.isOwner) throw new ForbiddenError(WEBHOOK_OWNERS_ONLY);
  return company;
}

/** A new signing secret: 32 random bytes, the hash's output length, below which RFC 2104 section 3 discourages HMAC keys. */
function newSecret(): string {
  return `whsec_${randomBytes(32).toString('base64url')}`;
}

const TOO_MANY = `Your company has ${MAX_WEBHOOK_ENDPOINTS} active webhook endpoints already; remove or deactivate one first.`;

/** Counted under a lock on the company row, so two owners adding at once cannot pass the limit together. */
async function assertRoomForActiveEndpoint(trx: DB, company: string): Promise<void> {
  await lockCompanyWebhooks(trx, company);
  if ((await countActiveWebhookEndpoints(trx, company)) >= MAX_WEBHOOK_ENDPOINTS) throw new ConflictError(TOO_MANY);
}

function assertTargetAllowed(url: string): void {
  const problem = webhookTargetProblem(url);
  if (problem) throw new ValidationError([{ path: 'url', message: problem }]);
}

/** An endpoint as the API answers it. */
export function endpointBody(e: WebhookEndpoint) {
  return {
    id: e.id,
    url: e.url,
    events: e.events,
    active: e.isActive,
    createdAt: e.createdAt,
    createdBy: e.createdBy?.name ?? null,
    secretRotatedAt: e.secretRotatedAt,
    updatedAt: e.updatedAt,
  };
}

/** A delivery as the API answers it (the state in the pages' words too). */
export function deliveryBody(d: WebhookDelivery) {
  const state = webhookDeliveryState(d);
  return {
    id: d.id,
    endpointId: d.endpointId,
    eventId: d.eventId,
    eventType: d.eventType,
    status: d.status,
    attempts: d.attempts,
    maxAttempts: d.maxAttempts,
    lastResponseStatus: d.lastResponseStatus,
    lastError: d.lastError,
    createdAt: d.createdAt,
    deliveredAt: d.deliveredAt,
    updatedAt: d.updatedAt,
    label: state.label,
    canSendAgain: state.canSendAgain,
  };
}

export async function listWebhooks(db: DB, actor: AppUser): Promise<WebhookEndpoint[]> {
  return listWebhookEndpoints(db, readerCompany(actor));
}

/** The company's endpoints with the latest deliveries of each, for the company page. */
export async function readWebhooksOverview(db: DB, actor: AppUser, perEndpoint = 10) {
  const company = readerCompany(actor);
  const [endpoints, deliveries] = await Promise.all([listWebhookEndpoints(db, company), listRecentWebhookDeliveries(db, company, perEndpoint)]);
  return { endpoints, deliveries };
}

/** Adds an endpoint; the answer holds its secret, the only time it is shown. */
export async function createWebhook(db: DB, actor: AppUser, input: WebhookCreateOutput): Promise<{ endpoint: WebhookEndpoint; secret: string }> {
  const company = ownerCompany(actor);
  assertTargetAllowed(input.url);
  const secret = newSecret();
  const id = await db.transaction().execute(async (trx) => {
    await assertRoomForActiveEndpoint(trx, company);
    const id = await insertWebhookEndpoint(trx, { organizationId: company, url: input.url, events: input.events, secret, createdBy: actor.id });
    await writeAudit(trx, { actorUserId: actor.id, action: 'webhook.create', entityType: 'webhook_endpoint', entityId: id, organizationId: company, details: { url: input.url, events: input.events } });
    return id;
  });
  return { endpoint: (await findWebhookEndpoint(db, company, id))!, secret };
}

export async function updateWebhook(db: DB, actor: AppUser, id: string, input: WebhookUpdateInput): Promise<WebhookEndpoint> {
  const company = ownerCompany(actor);
  if (input.url !== undefined) assertTargetAllowed(input.url);
  await db.transaction().execute(async (trx) => {
    const before = await findWebhookEndpoint(trx, company, id);
    if (!before) throw new NotFoundError(NO_SUCH_ENDPOINT);
    if (input.active === true && !before.isActive) await assertRoomForActiveEndpoint(trx, company);
    const changed = await updateWebhookEndpoint(trx, company, id, { url: input.url, events: input.events, isActive: input.active });
    if (!changed) throw new NotFoundError(NO_SUCH_ENDPOINT);
    await writeAudit(trx, { actorUserId: actor.id, action: 'webhook.update', entityType: 'webhook_endpoint', entityId: id, organizationId: company, details: { ...input } });
  });
  return (await findWebhookEndpoint(db, company, id))!;
}

/**
 * Removes an endpoint that never had a delivery; one with deliveries is deactivated instead, so its delivery
 * history stays readable.
 */
export async function removeWebhook(db: DB, actor: AppUser, id: string): Promise<{ deleted: boolean; endpoint: WebhookEndpoint | null }> {
  const company = ownerCompany(actor);
  const found = await findWebhookEndpoint(db, company, id);
  if (!found) throw new NotFoundError(NO_SUCH_ENDPOINT);
  const deleted = await db.transaction().execute(async (trx) => {
    const gone = await deleteWebhookEndpointWithoutDeliveries(trx, company, id);
    if (!gone) await updateWebhookEndpoint(trx, company, id, { isActive: false });
    await writeAudit(trx, { actorUserId: actor.id, action: gone ? 'webhook.delete' : 'webhook.deactivate', entityType: 'webhook_endpoint', entityId: id, organizationId: company, details: { url: found.url } });
    return gone;
  });
  return { deleted, endpoint: deleted ? null : await findWebhookEndpoint(db, company, id) };
}

/** A new secret for the endpoint; deliveries from now on (retries included) are signed with it. */
export async function rotateWebhookSecret(db: DB, actor: AppUser, id: string): Promise<{ endpoint: WebhookEndpoint; secret: string }> {
  const company = ownerCompany(actor);
  const secret = newSecret();
  await db.transaction().execute(async (trx) => {
    if (!(await setWebhookSecret(trx, company, id, secret))) throw new NotFoundError(NO_SUCH_ENDPOINT);
    await writeAudit(trx, { actorUserId: actor.id, action: 'webhook.rotate-secret', entityType: 'webhook_endpoint', entityId: id, organizationId: company, details: {} });
  });
  return { endpoint: (await findWebhookEndpoint(db, company, id))!, secret };
}

export async function listEndpointDeliveries(db: DB, actor: AppUser, endpointId: string, limit = 20): Promise<WebhookDelivery[]> {
  const company = readerCompany(actor);
  const endpoint = await findWebhookEndpoint(db, company, endpointId);
  if (!endpoint) throw new NotFoundError(NO_SUCH_ENDPOINT);
  return listWebhookDeliveries(db, endpoint.id, limit);
}

/** "Send again": a delivery that failed its last attempt goes back in the queue with a fresh set of attempts. */
export async function sendWebhookDeliveryAgain(db: DB, actor: AppUser, deliveryId: string): Promise<WebhookDelivery> {
  const company = ownerCompany(actor);
  const delivery = await findWebhookDelivery(db, deliveryId);
  if (!delivery || delivery.organizationId !== company) throw new NotFoundError(NO_SUCH_DELIVERY);
  if (delivery.status === 'delivered') throw new ConflictError('This delivery was already delivered.');
  if (delivery.status !== 'failed') throw new ConflictError('This delivery is still being tried; it can be sent again after its last attempt.');
  const endpoint = await findWebhookEndpoint(db, company, delivery.endpointId);
  if (!endpoint?.isActive) throw new ConflictError('The endpoint is deactivated; activate it before sending again.');
  const requeued = await requeueFailedWebhookDelivery(db, delivery.id, webhookDeliveryConfig().maxAttempts);
  if (!requeued) throw new ConflictError('This delivery was sent again meanwhile.');
  await dispatchWebhookDeliveries([requeued.id]);
  return requeued;
}
