import { randomBytes } from 'node:crypto';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SharedLimiter } from '@/lib/platform/rate-limit';
import { EVALUATIONS_PER_TOKEN, EVALUATIONS_PER_USER, REPORT_ISSUES_PER_USER, UPLOADS_PER_USER } from '@/lib/services/usage-limits';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import { api, appDatabaseUrl, appDb, baseUrl, newInstallerCompany, postJson, testPool } from './helpers';

/*
 * The costly routes' limits. Each test stands in for the requests before the last allowed one by counting them
 * through another app server's limiter on the same database (they count together, which the two-server test
 * proves), then makes the last allowed request and the first refused one through the app.
 */

const db = appDb();
const pool = testPool(appDatabaseUrl(), 2);
const otherServer = new SharedLimiter(pool);
afterAll(async () => {
  await db.destroy();
  await pool.end();
});

let company: Awaited<ReturnType<typeof newInstallerCompany>>;
let userId: string;
beforeAll(async () => {
  company = await newInstallerCompany(db, 'usage limits');
  userId = (await db.selectFrom('users').select('id').where('email', '=', company.email).executeTakeFirstOrThrow()).id;
});

function expectRetryAfter(res: { status: number; headers: Headers }, atMost: number) {
  // RFC 6585 §4 (429) with Retry-After in seconds (RFC 9110 §10.2.3), within the limit's window.
  expect(res.status).toBe(429);
  const seconds = Number(res.headers.get('retry-after'));
  expect(seconds).toBeGreaterThan(0);
  expect(seconds).toBeLessThanOrEqual(atMost);
}

describe('limits on the costly routes', () => {
  it('evaluations: 1,200 a minute per token, then 429 with Retry-After; another token of the same person still works', async () => {
    expect(EVALUATIONS_PER_TOKEN).toMatchObject({ points: 1200, durationSeconds: 60 });
    const made = await api('/api/tokens', postJson({ name: `limit ${randomBytes(3).toString('hex')}` }, { cookie: company.cookie }));
    expect(made.status, JSON.stringify(made.body)).toBe(201);
    const spare = await api('/api/tokens', postJson({ name: `spare ${randomBytes(3).toString('hex')}` }, { cookie: company.cookie }));
    const evaluate = (token: string) => api('/api/evaluations', postJson({ jurisdiction: 'demo-county', plan: hallClosetPassPlan, findings: 'failing' }, { token }));

    await otherServer.penalize(EVALUATIONS_PER_TOKEN, made.body.id, EVALUATIONS_PER_TOKEN.points - 1);
    expect((await evaluate(made.body.token)).status).toBe(200);
    const refused = await evaluate(made.body.token);
    expectRetryAfter(refused, 60);
    expect(refused.body.error).toMatch(/1,200 evaluations/);
    expect((await evaluate(spare.body.token)).status).toBe(200);
  });

  it('evaluations: 2,400 a minute per person across tokens and browser', async () => {
    expect(EVALUATIONS_PER_USER).toMatchObject({ points: 2400, durationSeconds: 60 });
    const other = await newInstallerCompany(db, 'usage limits person');
    const otherId = (await db.selectFrom('users').select('id').where('email', '=', other.email).executeTakeFirstOrThrow()).id;
    await otherServer.penalize(EVALUATIONS_PER_USER, otherId, EVALUATIONS_PER_USER.points - 1);
    const evaluate = () => api('/api/evaluations', postJson({ jurisdiction: 'demo-county', plan: hallClosetPassPlan }, { cookie: other.cookie }));
    expect((await evaluate()).status).toBe(200);
    expectRetryAfter(await evaluate(), 60);
  });

  it('report issuing: 120 an hour per person; the refused one stores no report', async () => {
    expect(REPORT_ISSUES_PER_USER).toMatchObject({ points: 120, durationSeconds: 3600 });
    const p = await api('/api/projects', postJson({ name: `Limits closet ${randomBytes(3).toString('hex')} (test)`, siteAddress: '5 Quota Court', jurisdiction: 'demo-county' }, { cookie: company.cookie }));
    expect((await api(`/api/projects/${p.body.id}/plans`, postJson({ plan: hallClosetPassPlan }, { cookie: company.cookie }))).status).toBe(201);
    const checkId = (await api(`/api/projects/${p.body.id}/checks`, postJson({}, { cookie: company.cookie }))).body.id as string;
    const count = async () => Number((await db.selectFrom('reports').select(db.fn.countAll<number>().as('n')).where('check_id', '=', checkId).executeTakeFirstOrThrow()).n);

    await otherServer.penalize(REPORT_ISSUES_PER_USER, userId, REPORT_ISSUES_PER_USER.points - 1);
    const issued = await fetch(`${baseUrl}/api/checks/${checkId}/report`, { method: 'POST', headers: { cookie: company.cookie } });
    expect(issued.status).toBe(200);
    await issued.arrayBuffer();
    expect(await count()).toBe(1);
    const refused = await api(`/api/checks/${checkId}/report`, { method: 'POST', cookie: company.cookie });
    expectRetryAfter(refused, 3600);
    expect(await count()).toBe(1);
  });

  it('uploads: 300 an hour per person; the refused one stores nothing', async () => {
    expect(UPLOADS_PER_USER).toMatchObject({ points: 300, durationSeconds: 3600 });
    const p = await api('/api/projects', postJson({ name: `Upload limits ${randomBytes(3).toString('hex')} (test)`, siteAddress: '6 Quota Court', jurisdiction: 'demo-county' }, { cookie: company.cookie }));
    const png = await sharp({ create: { width: 4, height: 4, channels: 3, background: '#777777' } }).png().toBuffer();
    const upload = async () => {
      const form = new FormData();
      form.set('file', new Blob([new Uint8Array(png)], { type: 'image/png' }), 'closet.png');
      const res = await fetch(`${baseUrl}/api/projects/${p.body.id}/attachments`, { method: 'POST', headers: { cookie: company.cookie }, body: form });
      return { status: res.status, headers: res.headers, body: await res.json() };
    };
    const count = async () => Number((await db.selectFrom('attachments').select(db.fn.countAll<number>().as('n')).where('project_id', '=', p.body.id).executeTakeFirstOrThrow()).n);

    await otherServer.penalize(UPLOADS_PER_USER, userId, UPLOADS_PER_USER.points - 1);
    const ok = await upload();
    expect(ok.status, JSON.stringify(ok.body)).toBe(201);
    expectRetryAfter(await upload(), 3600);
    expect(await count()).toBe(1);
  });
});
