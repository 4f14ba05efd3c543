import { randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hallClosetPassPlan, longExhaustFailPlan } from '@/tests/fixtures/plans';
import { api, appDb, newInstallerCompany, postJson, signIn, waitForMail, type InboxMessage } from './helpers';

/*
 * What a send asks before it goes: a check with failing findings is confirmed first (409 with
 * reason 'failing-findings' until then), an unfamiliar address after that; and every report e-mail
 * tells the recipient's mail program to reply to the installer who sent it.
 */

const db = appDb();

async function newCheck(cookie: string, plan: object): Promise<{ checkId: string; summary: { fail: number } }> {
  const p = await api('/api/projects', postJson({ name: `Send checks ${randomBytes(3).toString('hex')} (test)`, siteAddress: '9 Reply Lane', jurisdiction: 'demo-county' }, { cookie }));
  expect(p.status).toBe(201);
  expect((await api(`/api/projects/${p.body.id}/plans`, postJson({ plan }, { cookie }))).status).toBe(201);
  const check = await api(`/api/projects/${p.body.id}/checks`, postJson({}, { cookie }));
  expect(check.status, JSON.stringify(check.body)).toBe(201);
  return { checkId: check.body.id, summary: check.body.summary };
}

async function reportCount(checkId: string): Promise<number> {
  const r = await db.selectFrom('reports').select(db.fn.countAll<number>().as('n')).where('check_id', '=', checkId).executeTakeFirstOrThrow();
  return Number(r.n);
}

/** The report e-mail leaves through the outbox, a moment after the send answers. */
async function messageWithSubject(part: string): Promise<InboxMessage | undefined> {
  return (await waitForMail((m) => m.subject.includes(part)))[0];
}

beforeAll(async () => {
  await signIn('inspector@nookpass.demo');
});
afterAll(async () => {
  await db.destroy();
});

describe('confirmations before a report is sent', () => {
  it('asks to confirm a check with failing findings, issuing nothing until confirmed', { timeout: 180_000 }, async () => {
    const company = await newInstallerCompany(db, 'send-failing');
    const { checkId, summary } = await newCheck(company.cookie, longExhaustFailPlan);
    expect(summary.fail).toBeGreaterThan(0);
    const send = (body: object) => api(`/api/checks/${checkId}/send`, postJson(body, { cookie: company.cookie }));

    const asked = await send({});
    expect(asked.status).toBe(409);
    expect(asked.body).toMatchObject({
      needsConfirmation: true,
      reason: 'failing-findings',
      failing: summary.fail,
      errors: [{ path: 'confirmFailingFindings', message: expect.stringContaining(`${summary.fail} failing finding`) }],
    });
    expect(await reportCount(checkId)).toBe(0);

    // Confirming the address does not stand for confirming the failures.
    expect((await send({ confirm: true })).body.reason).toBe('failing-findings');

    // Confirmed failures, unfamiliar address: the address is asked about next, in its own words.
    const stranger = `fail-${randomBytes(4).toString('hex')}@example.test`;
    const address = await send({ to: stranger, confirmFailingFindings: true });
    expect(address.status).toBe(409);
    expect(address.body).toMatchObject({ needsConfirmation: true, reason: 'unfamiliar-address', errors: [{ path: 'to' }] });
    expect(await reportCount(checkId)).toBe(0);

    const sent = await send({ confirmFailingFindings: true });
    expect(sent.status, JSON.stringify(sent.body)).toBe(201);
    expect(sent.body).toMatchObject({ sent: true, toInspector: true });
    expect(await reportCount(checkId)).toBe(1);
  });

  it('sends a check with nothing failing without asking', { timeout: 120_000 }, async () => {
    const company = await newInstallerCompany(db, 'send-clean');
    const { checkId, summary } = await newCheck(company.cookie, hallClosetPassPlan);
    expect(summary.fail).toBe(0);
    const sent = await api(`/api/checks/${checkId}/send`, postJson({}, { cookie: company.cookie }));
    expect(sent.status, JSON.stringify(sent.body)).toBe(201);
  });

  it('refuses a confirmation flag that is not a boolean, naming the field', { timeout: 120_000 }, async () => {
    const company = await newInstallerCompany(db, 'send-flag');
    const { checkId } = await newCheck(company.cookie, hallClosetPassPlan);
    const bad = await api(`/api/checks/${checkId}/send`, postJson({ confirmFailingFindings: 'yes' }, { cookie: company.cookie }));
    expect(bad.status).toBe(400);
    expect(bad.body.errors[0].path).toBe('confirmFailingFindings');
  });
});

describe('the report e-mail', () => {
  it('carries Reply-To with the sending installer’s address', { timeout: 120_000 }, async () => {
    const company = await newInstallerCompany(db, 'reply-to');
    const { checkId } = await newCheck(company.cookie, hallClosetPassPlan);
    const sent = await api(`/api/checks/${checkId}/send`, postJson({}, { cookie: company.cookie }));
    expect(sent.status, JSON.stringify(sent.body)).toBe(201);
    const mail = await messageWithSubject(sent.body.report.code);
    expect(mail, 'the report e-mail is in the fake inbox').toBeTruthy();
    expect(mail!.to).toContain('inspector@nookpass.demo');
    // RFC 5322 §3.6.2: replies go to the Reply-To address, not to the NookPass sender.
    expect(mail!.replyTo).toContain(company.email);
  });
});
