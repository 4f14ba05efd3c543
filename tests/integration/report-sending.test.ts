import { randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SharedLimiter } from '@/lib/platform/rate-limit';
import { REPORT_SEND_LIMIT } from '@/lib/services/reports/limits';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import { api, appDatabaseUrl, appDb, newInstallerCompany, postJson, signIn, testPool, waitForMail } from './helpers';

/*
 * E-mailing reports: the inspector address and addresses the company used before go straight out, any
 * other address needs confirming; only sends to the inspector address fill the inspector's queue; the
 * note has a maximum; each company has an hourly limit. Each test runs as a company of its own.
 */

const db = appDb();
const inbox = process.env.NOOKPASS_INBOX_URL ?? 'http://127.0.0.1:54326';
let inspector: string;

async function newCheck(cookie: string): Promise<string> {
  const p = await api('/api/projects', postJson({ name: `Sending closet ${randomBytes(3).toString('hex')} (test)`, siteAddress: '4 Mail Road', jurisdiction: 'demo-county' }, { cookie }));
  expect(p.status).toBe(201);
  expect((await api(`/api/projects/${p.body.id}/plans`, postJson({ plan: hallClosetPassPlan }, { cookie }))).status).toBe(201);
  return (await api(`/api/projects/${p.body.id}/checks`, postJson({}, { cookie }))).body.id;
}

/** Reports issued for one check (other test files issue reports at the same time). */
async function reportCount(checkId: string): Promise<number> {
  const r = await db.selectFrom('reports').select(db.fn.countAll<number>().as('n')).where('check_id', '=', checkId).executeTakeFirstOrThrow();
  return Number(r.n);
}

async function mailsTo(address: string): Promise<number> {
  const messages = (await (await fetch(`${inbox}/api/messages`)).json()) as Array<{ to: string }>;
  return messages.filter((m) => m.to.toLowerCase().includes(address.toLowerCase())).length;
}

// The queue comes a page at a time; asking for the code finds it wherever it would be.
const queueCodes = async (code: string) => (await api(`/api/inspections?q=${code}`, { cookie: inspector })).body.inspections.map((i: { code: string }) => i.code) as string[];

beforeAll(async () => {
  inspector = await signIn('inspector@nookpass.demo');
});
afterAll(async () => {
  await db.destroy();
});

describe('sending a report by e-mail', () => {
  it('asks before a new address, goes straight to one used before, and fills the queue only from the inspector address', { timeout: 90_000 }, async () => {
    const company = await newInstallerCompany(db, 'sending');
    const checkId = await newCheck(company.cookie);
    const stranger = `someone-${randomBytes(4).toString('hex')}@example.test`;
    const send = (body: object) => api(`/api/checks/${checkId}/send`, postJson(body, { cookie: company.cookie }));

    const reportsBefore = await reportCount(checkId);
    const asked = await send({ to: stranger });
    expect(asked.status).toBe(409);
    expect(asked.body).toMatchObject({ needsConfirmation: true, errors: [{ path: 'to', message: expect.stringContaining('confirm: true') }] });
    expect(asked.body.error).toContain('inspector@nookpass.demo');
    // Nothing issued, nothing mailed, nothing counted against the company.
    expect(await reportCount(checkId)).toBe(reportsBefore);
    expect(await mailsTo(stranger)).toBe(0);

    const confirmed = await send({ to: stranger, confirm: true });
    expect(confirmed.status, JSON.stringify(confirmed.body)).toBe(201);
    expect(confirmed.body).toMatchObject({ sent: true, to: stranger, toInspector: false });
    // The e-mail leaves through the outbox a moment later, once.
    await waitForMail((m) => m.to.toLowerCase().includes(stranger.toLowerCase()));
    expect(await mailsTo(stranger)).toBe(1);
    const again = await send({ to: stranger.toUpperCase() });
    expect(again.status, JSON.stringify(again.body)).toBe(201);

    // Neither copy is in the county queue, and the county inspector cannot open them.
    for (const code of [confirmed.body.report.code, again.body.report.code]) {
      expect(await queueCodes(code)).not.toContain(code);
      const id = (await db.selectFrom('reports').select('id').where('code', '=', code).executeTakeFirstOrThrow()).id;
      expect((await api(`/api/inspections/${id}`, { cookie: inspector })).status).toBe(404);
      expect((await api(`/api/reports/${code}/pdf`, { cookie: inspector })).status).toBe(404);
    }

    // The inspector address needs no confirmation, in any letter case, and fills the queue.
    const official = await send({ to: 'Inspector@NookPass.demo' });
    expect(official.status, JSON.stringify(official.body)).toBe(201);
    expect(official.body.toInspector).toBe(true);
    expect(await queueCodes(official.body.report.code)).toContain(official.body.report.code);
    const rows = await db
      .selectFrom('report_sends as s')
      .innerJoin('reports as r', 'r.id', 's.report_id')
      .select('s.to_inspector')
      .where('r.check_id', '=', checkId)
      .execute();
    expect(rows.map((r) => r.to_inspector).sort()).toEqual([false, false, true]);
  });

  it('takes a note of up to 1,000 characters and refuses a longer one before issuing anything', { timeout: 60_000 }, async () => {
    const company = await newInstallerCompany(db, 'note');
    const checkId = await newCheck(company.cookie);
    const before = await reportCount(checkId);
    const long = await api(`/api/checks/${checkId}/send`, postJson({ note: 'n'.repeat(1001) }, { cookie: company.cookie }));
    expect(long.status).toBe(400);
    expect(long.body.errors[0]).toMatchObject({ path: 'note', message: expect.stringContaining('1,000') });
    expect(await reportCount(checkId)).toBe(before);
    const atLimit = await api(`/api/checks/${checkId}/send`, postJson({ note: 'n'.repeat(1000) }, { cookie: company.cookie }));
    expect(atLimit.status, JSON.stringify(atLimit.body)).toBe(201);
  });

  it('allows 30 sends an hour per company, then answers 429 with Retry-After and issues nothing', { timeout: 60_000 }, async () => {
    const company = await newInstallerCompany(db, 'send-limit');
    const checkId = await newCheck(company.cookie);
    // 29 sends this hour recorded through another app server's limiter on the same database; the app's
    // own counting takes the 30th and refuses the 31st.
    const pool = testPool(appDatabaseUrl(), 1);
    try {
      await new SharedLimiter(pool).penalize(REPORT_SEND_LIMIT, company.organizationId, REPORT_SEND_LIMIT.points - 1);
    } finally {
      await pool.end();
    }
    expect(REPORT_SEND_LIMIT).toMatchObject({ points: 30, durationSeconds: 3600 });
    const thirtieth = await api(`/api/checks/${checkId}/send`, postJson({}, { cookie: company.cookie }));
    expect(thirtieth.status, JSON.stringify(thirtieth.body)).toBe(201);
    const before = await reportCount(checkId);
    const refused = await api(`/api/checks/${checkId}/send`, postJson({}, { cookie: company.cookie }));
    expect(refused.status).toBe(429);
    // RFC 6585 §4 with Retry-After in seconds (RFC 9110 §10.2.3), within the hour.
    const retryAfter = Number(refused.headers.get('retry-after'));
    expect(retryAfter).toBeGreaterThan(0);
    expect(retryAfter).toBeLessThanOrEqual(3600);
    expect(refused.body.error).toMatch(/30 reports in the last hour/);
    expect(await reportCount(checkId)).toBe(before);
    // Another company is not held back.
    const other = await newInstallerCompany(db, 'send-limit-other');
    expect((await api(`/api/checks/${await newCheck(other.cookie)}/send`, postJson({}, { cookie: other.cookie }))).status).toBe(201);
  });
});
