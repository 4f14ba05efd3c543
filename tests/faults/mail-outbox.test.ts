import { execFile } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { promisify } from 'node:util';
import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import { api, appDb, baseUrl, inboxMessages, newInstallerCompany, postJson, waitForMail, waitForMailState } from '../integration/helpers';

/*
 * The e-mail outbox with the mail relay taken away: a message that runs out of attempts waits for a person to
 * send it again, and a message whose job was lost (a crash between the commit and the enqueue) is picked up by
 * the periodic pass. The served app runs with short retry delays (scripts/test.sh: 4 attempts, 1 s doubling).
 */

const run = promisify(execFile);
const suffix = process.env.NOOKPASS_FAKES_SUFFIX ?? '-test';
const db = appDb();
let cookie: string;
let checkId: string;

beforeAll(async () => {
  ({ cookie } = await newInstallerCompany(db, 'outbox'));
  const p = await api('/api/projects', postJson({ name: `Outbox ${randomBytes(3).toString('hex')} (test)`, siteAddress: '3 Relay Road', jurisdiction: 'demo-county' }, { cookie }));
  expect(p.status).toBe(201);
  expect((await api(`/api/projects/${p.body.id}/plans`, postJson({ plan: hallClosetPassPlan }, { cookie }))).status).toBe(201);
  const check = await api(`/api/projects/${p.body.id}/checks`, postJson({}, { cookie }));
  expect(check.status).toBe(201);
  checkId = check.body.id;
});
afterAll(async () => {
  await db.destroy();
});

describe('the e-mail outbox', () => {
  it('marks a message failed after its last attempt, and "send again" delivers it once', { timeout: 120_000 }, async () => {
    await run('bash', ['scripts/fakes.sh', 'stop', 'smtp', suffix]);
    let mailId: string;
    let code: string;
    let projectId: string;
    try {
      const res = await api(`/api/checks/${checkId}/send`, postJson({}, { cookie }));
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      mailId = res.body.mail.id;
      code = res.body.report.code;
      projectId = (await db.selectFrom('report_sends').select('project_id').where('id', '=', (await db.selectFrom('mail_outbox').select('report_send_id').where('id', '=', mailId).executeTakeFirstOrThrow()).report_send_id!).executeTakeFirstOrThrow()).project_id;
      const failed = await waitForMailState(mailId, cookie, (m) => m.status === 'failed', 60_000);
      expect(failed.attempts).toBe(failed.maxAttempts);
      expect(failed.label).toBe(`not sent after ${failed.maxAttempts} attempts`);
      expect(failed.lastError).toMatch(/mail server is not reachable/i);
      // The project page shows the state where the send was made, with the button.
      const page = await (await fetch(`${baseUrl}/projects/${projectId}`, { headers: { cookie } })).text();
      expect(page).toContain(`not sent after ${failed.maxAttempts} attempts`);
      expect(page).toContain('Send again');
    } finally {
      await run('bash', ['scripts/fakes.sh', 'start', 'smtp', suffix]);
    }
    // Nothing more happens on its own after the last attempt.
    expect((await api(`/api/mail/${mailId}`, { cookie })).body.status).toBe('failed');
    const again = await api(`/api/mail/${mailId}/send-again`, { method: 'POST', cookie });
    expect(again.status, JSON.stringify(again.body)).toBe(202);
    expect(again.body).toMatchObject({ status: 'queued', attempts: 0 });
    await waitForMailState(mailId, cookie, (m) => m.status === 'sent', 30_000);
    await waitForMail((m) => m.subject.includes(code));
    expect((await inboxMessages()).filter((m) => m.subject.includes(code))).toHaveLength(1);
    // Sent is final: asking again is a 409 that names the address.
    const twice = await api(`/api/mail/${mailId}/send-again`, { method: 'POST', cookie });
    expect(twice.status).toBe(409);
    expect(twice.body.error).toContain('already sent');
  });

  it('sends a message whose job was lost, through the periodic pass, once', { timeout: 150_000 }, async () => {
    // As a crash between the commit and the enqueue leaves it: the row on record as queued, no job for it.
    const to = `outbox-lost-${randomBytes(4).toString('hex')}@example.test`;
    const row = await db
      .insertInto('mail_outbox')
      .values({ kind: 'welcome', to_email: to, subject: 'Lost job (test)', body_text: `A message for ${to} whose job never reached the queue.`, max_attempts: 4, next_attempt_at: sql<Date>`now() - interval '5 minutes'` })
      .returning('id')
      .executeTakeFirstOrThrow();
    // The pass runs once a minute (a pg-boss cron schedule); it finds the row overdue and queues it.
    const deadline = Date.now() + 130_000;
    let status = 'queued';
    while (Date.now() < deadline && status !== 'sent') {
      await new Promise((r) => setTimeout(r, 1_000));
      status = (await db.selectFrom('mail_outbox').select('status').where('id', '=', row.id).executeTakeFirstOrThrow()).status;
    }
    expect(status).toBe('sent');
    await waitForMail((m) => m.to.includes(to));
    expect((await inboxMessages()).filter((m) => m.to.includes(to))).toHaveLength(1);
  });
});
