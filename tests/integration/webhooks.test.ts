import { randomBytes, randomUUID } from 'node:crypto';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import bcrypt from 'bcryptjs';
import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { claimWebhookDelivery } from '@/db/webhooks';
import { verifyWebhookSignature } from '@/lib/platform/webhooks/signature';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import { api, appDb, postJson, signIn, until } from './helpers';

/*
 * Webhooks end to end against the served app and a receiver started here on 127.0.0.1 (the served app
 * allows a local receiver: NODE_ENV is not production under next dev, and npm test sets
 * NOOKPASS_WEBHOOKS_ALLOW_LOCAL=1). The receiver records every request and answers as each test tells it.
 * Retries are short where npm test serves the app (NOOKPASS_WEBHOOK_ATTEMPTS=4, first retry after 1 s);
 * the tests read the attempt count from the delivery rather than assume it.
 */

const db = appDb();

type Received = { path: string; headers: http.IncomingHttpHeaders; body: string };
const received: Received[] = [];
/** Status codes a path answers with, in turn; the last one repeats. */
const answers = new Map<string, number[]>();
/** Where a path sends a redirect answer (Location). */
const redirects = new Map<string, string>();
let receiver: http.Server;
let receiverUrl: string;

let inspector: string;

type Company = { id: string; owner: string; installer: string };

/** A company of its own: an owner and a plain installer, both signed in (sends count against its own hourly limit). */
async function newCompany(label: string): Promise<Company> {
  const tag = randomBytes(4).toString('hex');
  const org = await db.insertInto('organizations').values({ name: `IT webhooks ${label} ${tag} (test)` }).returning('id').executeTakeFirstOrThrow();
  const hash = await bcrypt.hash(`it-pw-${tag}`, 4);
  await db.insertInto('users').values([
    { email: `it-hook-owner-${tag}@example.test`, name: `Owner ${tag}`, role: 'installer', organization_id: org.id, is_owner: true, password_hash: hash },
    { email: `it-hook-inst-${tag}@example.test`, name: `Installer ${tag}`, role: 'installer', organization_id: org.id, password_hash: hash },
  ]).execute();
  return { id: org.id, owner: await signIn(`it-hook-owner-${tag}@example.test`, `it-pw-${tag}`), installer: await signIn(`it-hook-inst-${tag}@example.test`, `it-pw-${tag}`) };
}

async function addEndpoint(cookie: string, path: string, events: string[]): Promise<{ id: string; secret: string }> {
  const res = await api('/api/webhooks', postJson({ url: `${receiverUrl}${path}`, events }, { cookie }));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body;
}

/** A project with a passing check, and its report sent to the Demo County inspector address. */
async function sendReport(cookie: string): Promise<{ projectId: string; code: string; reportId: string }> {
  const p = await api('/api/projects', postJson({ name: `Hook closet ${randomBytes(3).toString('hex')} (test)`, siteAddress: '9 Hook Lane (demo)', jurisdiction: 'demo-county' }, { cookie }));
  expect(p.status).toBe(201);
  expect((await api(`/api/projects/${p.body.id}/plans`, postJson({ plan: hallClosetPassPlan }, { cookie }))).status).toBe(201);
  const checkId = (await api(`/api/projects/${p.body.id}/checks`, postJson({}, { cookie }))).body.id;
  const sent = await api(`/api/checks/${checkId}/send`, postJson({}, { cookie }));
  expect(sent.status, JSON.stringify(sent.body)).toBe(201);
  const report = await db.selectFrom('reports').select('id').where('code', '=', sent.body.report.code).executeTakeFirstOrThrow();
  return { projectId: p.body.id, code: sent.body.report.code, reportId: report.id };
}

const at = (path: string) => received.filter((r) => r.path === path);

async function waitForRequests(path: string, count: number, ms = 30_000): Promise<Received[]> {
  return (await until(`${count} request(s) at ${path}`, async () => (at(path).length >= count ? at(path) : null), ms, 50)).value;
}

type DeliveryBody = { id: string; status: string; attempts: number; maxAttempts: number; lastResponseStatus: number | null; lastError: string | null; eventId: string; eventType: string; canSendAgain: boolean };

async function deliveries(cookie: string, endpointId: string): Promise<DeliveryBody[]> {
  const res = await api(`/api/webhooks/${endpointId}/deliveries`, { cookie });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body.deliveries;
}

async function waitForDelivery(cookie: string, endpointId: string, done: (d: DeliveryBody) => boolean, ms = 60_000): Promise<DeliveryBody> {
  return (await until('delivery state', async () => (await deliveries(cookie, endpointId)).find(done) ?? null, ms, 100)).value;
}

function expectSigned(r: Received, secret: string) {
  const check = verifyWebhookSignature(secret, r.body, r.headers['nookpass-signature'] as string);
  expect(check, `signature ${r.headers['nookpass-signature']}`).toMatchObject({ ok: true });
  const event = JSON.parse(r.body);
  expect(r.headers['nookpass-event-id']).toBe(event.id);
  expect(r.headers['nookpass-event-type']).toBe(event.type);
  expect(r.headers['content-type']).toBe('application/json');
  return event;
}

beforeAll(async () => {
  receiver = http.createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      const path = new URL(req.url ?? '/', 'http://x').pathname;
      received.push({ path, headers: req.headers, body: Buffer.concat(chunks).toString('utf8') });
      const queue = answers.get(path) ?? [200];
      const status = queue.length > 1 ? queue.shift()! : queue[0];
      const location = redirects.get(path);
      res.writeHead(status, { 'content-type': 'text/plain', ...(location ? { location: `${receiverUrl}${location}` } : {}) }).end(status < 300 ? 'ok' : 'not now');
    });
  });
  await new Promise<void>((resolve) => receiver.listen(0, '127.0.0.1', resolve));
  receiverUrl = `http://127.0.0.1:${(receiver.address() as AddressInfo).port}`;
  inspector = await signIn('inspector@nookpass.demo');
}, 60_000);

afterAll(async () => {
  await new Promise((resolve) => receiver.close(resolve));
  await db.destroy();
});

describe('webhook endpoints', () => {
  it('refuse a bad address or event with a 400 naming the field', async () => {
    const { owner } = await newCompany('validation');
    const cases: Array<[unknown, string]> = [
      [{ url: 'ftp://hooks.example.test/in', events: ['report.sent'] }, 'url'],
      [{ url: 'hooks.example.test/in', events: ['report.sent'] }, 'url'],
      [{ url: 'http://hooks.example.test/in', events: ['report.sent'] }, 'url'], // plain http only for a local receiver
      [{ url: 'https://10.0.0.8/in', events: ['report.sent'] }, 'url'], // RFC 1918
      [{ url: 'https://169.254.169.254/latest', events: ['report.sent'] }, 'url'], // RFC 3927 link-local
      [{ url: `https://hooks.example.test/${'x'.repeat(2000)}`, events: ['report.sent'] }, 'url'],
      [{ url: 'https://hooks.example.test/in', events: [] }, 'events'],
      [{ url: 'https://hooks.example.test/in', events: ['report.deleted'] }, 'events.0'],
      [{ events: ['report.sent'] }, 'url'],
    ];
    for (const [body, path] of cases) {
      const res = await api('/api/webhooks', postJson(body, { cookie: owner }));
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.errors.map((e: { path: string }) => e.path), JSON.stringify(res.body)).toContain(path);
    }
    expect((await api('/api/webhooks', { cookie: owner })).body.endpoints).toEqual([]);
  });

  it('deliver a signed report.sent and inspection.outcome_recorded to a receiver; the secret shows once', { timeout: 90_000 }, async () => {
    const company = await newCompany('signed');
    const hook = await addEndpoint(company.owner, '/signed', ['report.sent', 'inspection.outcome_recorded']);
    expect(hook.secret).toMatch(/^whsec_[A-Za-z0-9_-]{43}$/);
    // Read back by anyone of the company, never with the secret.
    for (const cookie of [company.owner, company.installer]) {
      const list = await api('/api/webhooks', { cookie });
      expect(list.status).toBe(200);
      expect(list.body.endpoints).toEqual([expect.objectContaining({ id: hook.id, url: `${receiverUrl}/signed`, events: ['report.sent', 'inspection.outcome_recorded'], active: true })]);
      expect(JSON.stringify(list.body)).not.toContain(hook.secret);
    }

    const { projectId, code, reportId } = await sendReport(company.owner);
    const [sent] = await waitForRequests('/signed', 1);
    const event = expectSigned(sent, hook.secret);
    expect(event).toMatchObject({
      type: 'report.sent',
      data: { project: { id: projectId }, report: { code, verifyUrl: expect.stringMatching(new RegExp(`/verify/${code}$`)) }, jurisdiction: { slug: 'demo-county' }, toInspector: true },
    });
    expect(event.id).toMatch(/^[0-9a-f-]{36}$/);
    expect(new Date(event.occurredAt).toISOString()).toBe(event.occurredAt);
    // No secret and no e-mail address travels in the body.
    expect(sent.body).not.toContain('@');
    expect(sent.body).not.toContain(hook.secret);
    const [delivered] = await deliveries(company.owner, hook.id);
    expect(delivered).toMatchObject({ eventId: event.id, eventType: 'report.sent', status: 'delivered', attempts: 1, lastResponseStatus: 200, canSendAgain: false });

    const review = await api(`/api/inspections/${reportId}/review`, postJson({ outcome: 'corrections-needed', comment: 'Add the duct length label (test).' }, { cookie: inspector }));
    expect(review.status, JSON.stringify(review.body)).toBe(201);
    const [, outcome] = await waitForRequests('/signed', 2);
    const recorded = expectSigned(outcome, hook.secret);
    expect(recorded).toMatchObject({
      type: 'inspection.outcome_recorded',
      data: { project: { id: projectId }, report: { code }, jurisdiction: { slug: 'demo-county' }, outcome: 'corrections-needed', inspector: { name: expect.any(String) }, revised: false, onAnswer: false },
    });
    expect(recorded.data.inspector.name.length).toBeGreaterThan(0);
    expect(recorded.id).not.toBe(event.id);
    expect(outcome.body).not.toContain('@');
  });

  it('retry a receiver that answers 500 until it answers 200: retrying, then delivered', { timeout: 90_000 }, async () => {
    const company = await newCompany('flaky');
    answers.set('/flaky', [500, 200]);
    const hook = await addEndpoint(company.owner, '/flaky', ['report.sent']);
    await sendReport(company.owner);
    const retrying = await waitForDelivery(company.owner, hook.id, (d) => d.status === 'retrying');
    expect(retrying).toMatchObject({ attempts: 1, lastResponseStatus: 500, lastError: 'The endpoint answered 500.', canSendAgain: false });
    const delivered = await waitForDelivery(company.owner, hook.id, (d) => d.status === 'delivered');
    expect(delivered).toMatchObject({ attempts: 2, lastResponseStatus: 200, lastError: null });
    const requests = at('/flaky');
    expect(requests).toHaveLength(2);
    // The same event both times, each attempt signed afresh.
    const [first, second] = requests.map((r) => expectSigned(r, hook.secret));
    expect(second.id).toBe(first.id);
  });

  it('follow no redirect: a 302 counts as a failed attempt and the target it names hears nothing', { timeout: 90_000 }, async () => {
    const company = await newCompany('redirect');
    answers.set('/moved', [302]);
    redirects.set('/moved', '/moved-here');
    const hook = await addEndpoint(company.owner, '/moved', ['report.sent']);
    await sendReport(company.owner);
    const retrying = await waitForDelivery(company.owner, hook.id, (d) => d.status === 'retrying' || d.status === 'failed');
    expect(retrying).toMatchObject({ lastResponseStatus: 302, lastError: 'The endpoint answered 302 (redirects are not followed).' });
    expect(at('/moved-here')).toHaveLength(0);
    // Stop it here, so its remaining attempts end at once.
    expect((await api(`/api/webhooks/${hook.id}`, postJson({ active: false }, { cookie: company.owner, method: 'PATCH' }))).status).toBe(200);
  });

  it('fail after the last attempt, then "send again" (owners only) delivers it', { timeout: 120_000 }, async () => {
    const company = await newCompany('down');
    const other = await newCompany('down-other');
    answers.set('/down', [500]);
    const hook = await addEndpoint(company.owner, '/down', ['report.sent']);
    await sendReport(company.owner);
    const failed = await waitForDelivery(company.owner, hook.id, (d) => d.status === 'failed', 90_000);
    expect(failed.attempts).toBe(failed.maxAttempts);
    expect(failed).toMatchObject({ lastResponseStatus: 500, canSendAgain: true });
    expect(at('/down')).toHaveLength(failed.maxAttempts);

    answers.set('/down', [200]);
    expect((await api(`/api/webhook-deliveries/${failed.id}/send-again`, { method: 'POST', cookie: company.installer })).status).toBe(403);
    expect((await api(`/api/webhook-deliveries/${failed.id}/send-again`, { method: 'POST', cookie: other.owner })).status).toBe(404);
    const again = await api(`/api/webhook-deliveries/${failed.id}/send-again`, { method: 'POST', cookie: company.owner });
    expect(again.status, JSON.stringify(again.body)).toBe(202);
    expect(again.body).toMatchObject({ id: failed.id, status: 'queued', attempts: 0 });
    const delivered = await waitForDelivery(company.owner, hook.id, (d) => d.id === failed.id && d.status === 'delivered');
    expect(delivered).toMatchObject({ attempts: 1, lastResponseStatus: 200 });
    expect(at('/down')).toHaveLength(failed.maxAttempts + 1);
    // Once delivered, there is nothing to send again.
    expect((await api(`/api/webhook-deliveries/${failed.id}/send-again`, { method: 'POST', cookie: company.owner })).status).toBe(409);
  });

  it('belong to one company: another company sees none of them and touching one is a 404; plain installers may only read', async () => {
    const company = await newCompany('mine');
    const other = await newCompany('theirs');
    const hook = await addEndpoint(company.owner, '/mine', ['report.sent']);
    expect((await api('/api/webhooks', { cookie: other.owner })).body.endpoints).toEqual([]);
    const tries = [
      api(`/api/webhooks/${hook.id}`, postJson({ active: false }, { cookie: other.owner, method: 'PATCH' })),
      api(`/api/webhooks/${hook.id}`, { method: 'DELETE', cookie: other.owner }),
      api(`/api/webhooks/${hook.id}/rotate-secret`, { method: 'POST', cookie: other.owner }),
      api(`/api/webhooks/${hook.id}/deliveries`, { cookie: other.owner }),
      api(`/api/webhooks/${hook.id}/deliveries`, { cookie: other.installer }),
    ];
    for (const res of await Promise.all(tries)) expect(res.status).toBe(404);
    // The company's plain installers read but do not change.
    expect((await api('/api/webhooks', postJson({ url: `${receiverUrl}/x`, events: ['report.sent'] }, { cookie: company.installer }))).status).toBe(403);
    expect((await api(`/api/webhooks/${hook.id}`, postJson({ active: false }, { cookie: company.installer, method: 'PATCH' }))).status).toBe(403);
    expect((await api(`/api/webhooks/${hook.id}/rotate-secret`, { method: 'POST', cookie: company.installer })).status).toBe(403);
    expect((await api(`/api/webhooks/${hook.id}/deliveries`, { cookie: company.installer })).status).toBe(200);
    // Still as it was.
    expect((await api('/api/webhooks', { cookie: company.owner })).body.endpoints).toEqual([expect.objectContaining({ id: hook.id, active: true })]);
  });

  it('rotate the secret (later deliveries verify only with the new one) and deactivate, rather than delete, an endpoint with deliveries', { timeout: 90_000 }, async () => {
    const company = await newCompany('rotate');
    const hook = await addEndpoint(company.owner, '/rotate', ['report.sent']);
    const unused = await addEndpoint(company.owner, '/unused', ['inspection.outcome_recorded']);
    await sendReport(company.owner);
    await waitForRequests('/rotate', 1);

    const rotated = await api(`/api/webhooks/${hook.id}/rotate-secret`, { method: 'POST', cookie: company.owner });
    expect(rotated.status).toBe(200);
    expect(rotated.body.secret).toMatch(/^whsec_/);
    expect(rotated.body.secret).not.toBe(hook.secret);
    await sendReport(company.owner);
    const [, later] = await waitForRequests('/rotate', 2);
    expectSigned(later, rotated.body.secret);
    expect(verifyWebhookSignature(hook.secret, later.body, later.headers['nookpass-signature'] as string).ok).toBe(false);

    // An endpoint that never had a delivery goes; one with deliveries stays, deactivated, its history kept.
    expect((await api(`/api/webhooks/${unused.id}`, { method: 'DELETE', cookie: company.owner })).body).toMatchObject({ deleted: true, deactivated: false });
    const removed = await api(`/api/webhooks/${hook.id}`, { method: 'DELETE', cookie: company.owner });
    expect(removed.status).toBe(200);
    expect(removed.body).toMatchObject({ deleted: false, deactivated: true, endpoint: { id: hook.id, active: false } });
    expect((await api('/api/webhooks', { cookie: company.owner })).body.endpoints.map((e: { id: string; active: boolean }) => [e.id, e.active])).toEqual([[hook.id, false]]);
    expect(await deliveries(company.owner, hook.id)).toHaveLength(2);
    // A deactivated endpoint hears of nothing new (deliveries are recorded with the send, so this is certain at once).
    await sendReport(company.owner);
    expect(await deliveries(company.owner, hook.id)).toHaveLength(2);
    // Turned on again, it receives the next one.
    expect((await api(`/api/webhooks/${hook.id}`, postJson({ active: true }, { cookie: company.owner, method: 'PATCH' }))).body).toMatchObject({ active: true });
    await sendReport(company.owner);
    expect(await deliveries(company.owner, hook.id)).toHaveLength(3);
  });
});

describe('webhook deliveries in the database', () => {
  it('keep what was sent, and are claimed by one worker at a time', async () => {
    const company = await newCompany('guard');
    const endpoint = await db
      .insertInto('webhook_endpoints')
      .values({ organization_id: company.id, url: `${receiverUrl}/guard`, events: ['report.sent'], secret: `whsec_${randomBytes(32).toString('base64url')}` })
      .returning('id')
      .executeTakeFirstOrThrow();
    const delivery = await db
      .insertInto('webhook_deliveries')
      .values({ endpoint_id: endpoint.id, event_id: randomUUID(), event_type: 'report.sent', payload: JSON.stringify({ test: true }), max_attempts: 3, next_attempt_at: new Date(Date.now() + 3600_000) })
      .returning('id')
      .executeTakeFirstOrThrow();
    await expect(sql`UPDATE webhook_deliveries SET payload = '{"test": false}' WHERE id = ${delivery.id}`.execute(db)).rejects.toThrow(/keeps what was sent/);
    await expect(sql`UPDATE webhook_deliveries SET event_type = 'inspection.outcome_recorded' WHERE id = ${delivery.id}`.execute(db)).rejects.toThrow(/keeps what was sent/);
    await expect(sql`DELETE FROM webhook_deliveries WHERE id = ${delivery.id}`.execute(db)).rejects.toThrow(/never deleted/);
    // An endpoint with deliveries cannot be deleted behind the app's back either.
    await expect(sql`DELETE FROM webhook_endpoints WHERE id = ${endpoint.id}`.execute(db)).rejects.toThrow(/foreign key/);

    // Five workers reach for the same delivery at once: one gets it.
    const claims = await Promise.all(Array.from({ length: 5 }, () => claimWebhookDelivery(db, delivery.id, 60)));
    expect(claims.filter((c) => c !== null)).toHaveLength(1);
    const row = await db.selectFrom('webhook_deliveries').select(['status', 'attempts']).where('id', '=', delivery.id).executeTakeFirstOrThrow();
    expect(row).toEqual({ status: 'sending', attempts: 1 });
    // Left as "sending" by a worker that never finished; it is stale only after the claim timeout, so nothing is posted twice.
    await sql`UPDATE webhook_deliveries SET status = 'failed', claimed_at = NULL WHERE id = ${delivery.id}`.execute(db);
  });
});
