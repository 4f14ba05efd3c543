import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hallClosetPassPlan } from '@/tests/fixtures/plans/hall-closet-pass';
import { api, appDb, baseUrl, postJson, signIn, waitForMail } from './helpers';

/*
 * The inspector's outcome and the correction thread on one report: the outcome stands until revised on
 * purpose, the installer answers "corrections needed" with a newer check and a note, the inspector sees
 * what changed and records the next outcome, and both sides read the whole thread in order.
 */
const db = appDb();
const inbox = process.env.NOOKPASS_INBOX_URL ?? 'http://127.0.0.1:54326';
// Without water-hammer arrestors the plan has a caution and nothing failing (common practice, no published source: the rule is a caution).
const cautionPlan = { ...hallClosetPassPlan, plumbing: { ...hallClosetPassPlan.plumbing, hammerArrestors: false } };
let installer: string;
let other: string;
let inspector: string;
let projectId: string;
let firstCheckId: string;
let reportId: string;
let code: string;

type Message = { subject: string; to: string; text: string };
const messages = async (): Promise<Message[]> => (await (await fetch(`${inbox}/api/messages`)).json()) as Message[];

beforeAll(async () => {
  [installer, other, inspector] = await Promise.all([signIn('installer@nookpass.demo'), signIn('other-installer@nookpass.demo'), signIn('inspector@nookpass.demo')]);
  projectId = (await api('/api/projects', postJson({ name: `IT thread ${Date.now()}`, siteAddress: '5 Thread Street', jurisdiction: 'demo-county' }, { cookie: installer }))).body.id;
  await api(`/api/projects/${projectId}/plans`, postJson({ plan: cautionPlan }, { cookie: installer }));
  const check = await api(`/api/projects/${projectId}/checks`, postJson({}, { cookie: installer }));
  firstCheckId = check.body.id;
  expect(check.body.findings.find((f: { ruleKey: string }) => f.ruleKey === 'plumbing.hammer-arrestors').status).toBe('caution');
  const sent = await api(`/api/checks/${firstCheckId}/send`, postJson({ note: 'Arrestors go in at trim-out.' }, { cookie: installer }));
  expect(sent.status).toBe(201);
  code = sent.body.report.code;
  reportId = (await db.selectFrom('reports').select('id').where('code', '=', code).executeTakeFirstOrThrow()).id;
});
afterAll(async () => {
  await db.destroy();
});

describe('the recorded outcome', () => {
  it('refuses an answer before any outcome (409) and keeps the installer’s note with the send', async () => {
    const early = await api(`/api/reports/${code}/answers`, postJson({ checkId: firstCheckId, note: 'x' }, { cookie: installer }));
    expect(early.status).toBe(409);
    const detail = await api(`/api/inspections/${reportId}`, { cookie: inspector });
    expect(detail.body.thread.entries[0]).toMatchObject({ kind: 'sent', note: 'Arrestors go in at trim-out.', reportCode: code });
    expect(detail.body.thread.state.kind).toBe('awaiting-outcome');
  });

  it('records once; recording again without revise is a 409 naming the outcome, and sends no second e-mail', async () => {
    const first = await api(
      `/api/inspections/${reportId}/review`,
      postJson({ outcome: 'corrections-needed', comment: 'Add arrestors before the final.', findingComments: { 'plumbing.hammer-arrestors': 'Required here.' } }, { cookie: inspector }),
    );
    expect(first.status).toBe(201);
    // The outcome e-mail leaves through the outbox; wait for it so a late delivery is not counted as a second one.
    await waitForMail((m) => m.subject.includes('Inspection outcome') && m.text.includes(code));
    const mailsBefore = (await messages()).filter((m) => m.subject.includes('Inspection outcome') && m.text.includes(code)).length;
    const again = await api(`/api/inspections/${reportId}/review`, postJson({ outcome: 'approved' }, { cookie: inspector }));
    expect(again.status).toBe(409);
    expect(again.body.error).toContain('Corrections needed');
    expect(again.body.error).toContain('Jordan Demo (inspector)');
    const mailsAfter = (await messages()).filter((m) => m.subject.includes('Inspection outcome') && m.text.includes(code)).length;
    expect(mailsAfter).toBe(mailsBefore);
    // Nor is one queued to go later.
    const queued = await db.selectFrom('mail_outbox').select('id').where('report_id', '=', reportId).where('kind', '=', 'inspection-outcome').execute();
    expect(queued).toHaveLength(1);
    const rows = await db.selectFrom('inspection_reviews').select('id').where('report_id', '=', reportId).execute();
    expect(rows).toHaveLength(1);
  });

  it('revises explicitly: a new row pointing at the one it revises; a stale id is refused', async () => {
    const [standing] = await db.selectFrom('inspection_reviews').select('id').where('report_id', '=', reportId).execute();
    const stale = await api(`/api/inspections/${reportId}/review`, postJson({ outcome: 'approved', revises: '00000000-0000-4000-8000-000000000000' }, { cookie: inspector }));
    expect(stale.status).toBe(409);
    const badFlag = await api(`/api/inspections/${reportId}/review`, postJson({ outcome: 'approved', revise: 'yes' }, { cookie: inspector }));
    expect(badFlag.status).toBe(400);
    expect(badFlag.body.errors[0].path).toBe('revise');
    const revised = await api(
      `/api/inspections/${reportId}/review`,
      postJson({ outcome: 'corrections-needed', comment: 'Add arrestors at both valves.', revises: standing.id }, { cookie: inspector }),
    );
    expect(revised.status).toBe(201);
    const rows = await db.selectFrom('inspection_reviews').select(['id', 'revises_id', 'comment']).where('report_id', '=', reportId).orderBy('created_at').execute();
    expect(rows.map((r) => r.revises_id)).toEqual([null, standing.id]);
    // Revising the same outcome twice is refused by the database too.
    await expect(
      db.insertInto('inspection_reviews').values({ report_id: reportId, outcome: 'approved', finding_comments: '{}', revises_id: standing.id }).execute(),
    ).rejects.toThrow(/inspection_reviews_revised_once/);
    const detail = await api(`/api/inspections/${reportId}`, { cookie: inspector });
    expect(detail.body.thread.state).toMatchObject({ kind: 'awaiting-corrections', current: { comment: 'Add arrestors at both valves.', inspectorName: 'Jordan Demo (inspector)' } });
    expect(detail.body.thread.entries.map((e: { kind: string }) => e.kind)).toEqual(['sent', 'outcome', 'outcome']);
  });
});

describe('the correction thread', () => {
  let newCheckId: string;

  it('answers 400 naming the field, 404 to another company, 403 to an inspector', async () => {
    const noNote = await api(`/api/reports/${code}/answers`, postJson({ checkId: firstCheckId }, { cookie: installer }));
    expect(noNote.status).toBe(400);
    expect(noNote.body.errors.map((e: { path: string }) => e.path)).toContain('note');
    const badId = await api(`/api/reports/${code}/answers`, postJson({ checkId: 'abc', note: 'Done.' }, { cookie: installer }));
    expect(badId.status).toBe(400);
    expect(badId.body.errors[0].path).toBe('checkId');
    // The check the inspector already saw cannot answer.
    const same = await api(`/api/reports/${code}/answers`, postJson({ checkId: firstCheckId, note: 'Done.' }, { cookie: installer }));
    expect(same.status).toBe(400);
    expect(same.body.errors[0]).toMatchObject({ path: 'checkId', message: expect.stringContaining('run a new check') });
    // Another company learns nothing about the report (404, as for its projects).
    expect((await api(`/api/reports/${code}/answers`, postJson({ checkId: firstCheckId, note: 'x' }, { cookie: other }))).status).toBe(404);
    expect((await api(`/api/reports/${code}/answers`, postJson({ checkId: firstCheckId, note: 'x' }, { cookie: inspector }))).status).toBe(403);
  });

  it('takes the latest, newer check with a note, issues its report and tells the inspector', async () => {
    await api(`/api/projects/${projectId}/plans`, postJson({ plan: hallClosetPassPlan }, { cookie: installer }));
    newCheckId = (await api(`/api/projects/${projectId}/checks`, postJson({}, { cookie: installer }))).body.id;
    const res = await api(`/api/reports/${reportId}/answers`, postJson({ checkId: newCheckId, note: 'Arrestors fitted at both valves.' }, { cookie: installer }));
    expect(res.status).toBe(201);
    expect(res.body.mailed).toBe(1);
    const [mail] = await waitForMail((m) => m.subject.includes('Corrections answered') && m.text.includes(res.body.report.code));
    expect(mail.to).toContain('inspector@nookpass.demo');
    expect(mail.text).toContain('Arrestors fitted at both valves.');
    // Answered once: a second answer waits for the inspector's outcome.
    expect((await api(`/api/reports/${code}/answers`, postJson({ checkId: newCheckId, note: 'Again.' }, { cookie: installer }))).status).toBe(409);
    // The answer's report opens for the inspector, though it was never sent on its own.
    expect((await fetch(`${baseUrl}/api/reports/${res.body.report.code}/pdf`, { headers: { cookie: inspector } })).status).toBe(200);
  });

  it('shows the inspector what changed, and the next outcome goes on the answer without revise', async () => {
    const detail = await api(`/api/inspections/${reportId}`, { cookie: inspector });
    expect(detail.body.check.id).toBe(newCheckId);
    expect(detail.body.thread.state.kind).toBe('awaiting-outcome');
    const answer = detail.body.thread.entries.at(-1);
    expect(answer).toMatchObject({ kind: 'answer', note: 'Arrestors fitted at both valves.', checkId: newCheckId });
    expect(answer.changes.findings).toContainEqual(expect.objectContaining({ ruleKey: 'plumbing.hammer-arrestors', from: 'caution', to: 'pass' }));
    expect(answer.changes.plan).toContainEqual(expect.objectContaining({ path: 'plumbing.hammerArrestors', from: 'no', to: 'yes' }));
    const approve = await api(`/api/inspections/${reportId}/review`, postJson({ outcome: 'approved', comment: 'Approved.' }, { cookie: inspector }));
    expect(approve.status).toBe(201);
    const row = await db.selectFrom('inspection_reviews').select(['answer_id', 'revises_id']).where('id', '=', approve.body.review.id).executeTakeFirstOrThrow();
    expect(row.answer_id).toBe(answer.id);
    expect(row.revises_id).toBeNull();
    expect((await api(`/api/reports/${code}/answers`, postJson({ checkId: newCheckId, note: 'x' }, { cookie: installer }))).status).toBe(409);
  });

  it('keeps the whole thread, in order, for both sides; answers are append-only', { timeout: 120_000 }, async () => {
    const mine = await api(`/api/reports/${code}/answers`, { cookie: installer });
    const theirs = await api(`/api/reports/${code}/answers`, { cookie: inspector });
    const kinds = ['sent', 'outcome', 'outcome', 'answer', 'outcome'];
    expect(mine.body.entries.map((e: { kind: string }) => e.kind)).toEqual(kinds);
    expect(theirs.body.entries.map((e: { kind: string }) => e.kind)).toEqual(kinds);
    expect(mine.body.state.kind).toBe('approved');
    expect((await api(`/api/reports/${code}/answers`, { cookie: other })).status).toBe(404);
    const html = await (await fetch(`${baseUrl}/projects/${projectId}`, { headers: { cookie: installer } })).text();
    expect(html).toContain('Arrestors fitted at both valves.');
    expect(html).toContain('Approved by the inspector.');
    await expect(db.updateTable('correction_answers').set({ note: 'changed' }).where('report_id', '=', reportId).execute()).rejects.toThrow(/append-only/);
  });
});
