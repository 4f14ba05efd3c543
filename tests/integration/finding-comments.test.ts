import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import { api, appDb, baseUrl, newInstallerCompany, postJson, signIn } from './helpers';

// An inspector comments on any finding of the reported check, a passed one too, and the installer reads the
// comment beside that finding (check API, check page, project page), not only in the e-mail.

const db = appDb();
const escapeHtml = (t: string) => t.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#x27;');
let installer: string;
let inspector: string;
let projectId: string;
let checkId: string;
let reportId: string;
let passed: { ruleKey: string; title: string };
let failing: { ruleKey: string; title: string } | undefined;

beforeAll(async () => {
  ({ cookie: installer } = await newInstallerCompany(db, 'finding comments'));
  inspector = await signIn('inspector@nookpass.demo');
  const p = await api('/api/projects', postJson({ name: 'Finding comments (test)', siteAddress: '3 Comment Court', jurisdiction: 'demo-county' }, { cookie: installer }));
  projectId = p.body.id;
  expect((await api(`/api/projects/${projectId}/plans`, postJson({ plan: hallClosetPassPlan }, { cookie: installer }))).status).toBe(201);
  const check = await api(`/api/projects/${projectId}/checks`, postJson({}, { cookie: installer }));
  checkId = check.body.id;
  const findings = check.body.findings as Array<{ ruleKey: string; title: string; status: string }>;
  passed = findings.find((f) => f.status === 'pass')!;
  failing = findings.find((f) => f.status !== 'pass' && f.status !== 'not-applicable');
  expect(passed).toBeTruthy();
  const send = await api(`/api/checks/${checkId}/send`, postJson({ to: 'inspector@nookpass.demo', confirmFailingFindings: true }, { cookie: installer }));
  expect(send.status).toBe(201);
  reportId = (await db.selectFrom('reports').select('id').where('code', '=', send.body.report.code).executeTakeFirstOrThrow()).id;
}, 90_000);
afterAll(async () => {
  await db.destroy();
});

describe('comments on findings', () => {
  it('refuses a key that is not a finding of the reported check, naming it, and saves nothing', async () => {
    for (const key of ['exhaust.nonsense', 'Exhaust.Developed-Length', 'not a key']) {
      const res = await api(`/api/inspections/${reportId}/review`, postJson({ outcome: 'approved', findingComments: { [passed.ruleKey]: 'Fine.', [key]: 'x' } }, { cookie: inspector }));
      expect(res.status).toBe(400);
      expect(res.body.errors).toEqual([{ path: `findingComments.${key}`, message: expect.stringContaining(key) }]);
    }
    const rows = await db.selectFrom('inspection_reviews').select('id').where('report_id', '=', reportId).execute();
    expect(rows).toHaveLength(0);
  });

  it('accepts a comment on a passed finding and shows it beside that finding with the inspector and the date', async () => {
    const comments = { [passed.ruleKey]: 'Seen on site: built as drawn.', ...(failing ? { [failing.ruleKey]: 'Bring the label to the visit.' } : {}) };
    const ok = await api(`/api/inspections/${reportId}/review`, postJson({ outcome: 'approved', findingComments: comments }, { cookie: inspector }));
    expect(ok.status).toBe(201);

    const check = await api(`/api/checks/${checkId}`, { cookie: installer });
    expect(check.status).toBe(200);
    expect(check.body.inspectorComments[passed.ruleKey]).toEqual([
      { comment: 'Seen on site: built as drawn.', inspectorName: expect.any(String), outcome: 'approved', reportCode: expect.stringMatching(/^NP-/), at: expect.any(String) },
    ]);
    expect(check.body.inspectorComments[passed.ruleKey][0].inspectorName.length).toBeGreaterThan(0);
    expect(Date.now() - Date.parse(check.body.inspectorComments[passed.ruleKey][0].at)).toBeLessThan(10 * 60_000);
    if (failing) expect(check.body.inspectorComments[failing.ruleKey][0].comment).toBe('Bring the label to the visit.');

    const page = await (await fetch(`${baseUrl}/projects/${projectId}/checks/${checkId}`, { headers: { cookie: installer } })).text();
    expect(page).toContain('Seen on site: built as drawn.');
    // The project's outcome list names the finding as people read it, not by its rule key.
    const project = await (await fetch(`${baseUrl}/projects/${projectId}`, { headers: { cookie: installer } })).text();
    const line = project.match(/<p[^>]*data-testid="outcome-finding-comment"[^>]*>(.*?)<\/p>/s)?.[1] ?? '';
    expect(line).toContain(`>${escapeHtml(passed.title)}</a>`);
    expect(line).toContain('Seen on site: built as drawn.');
  }, 120_000);

  it('keeps another company out of the comments', async () => {
    const other = await signIn('other-installer@nookpass.demo');
    expect((await api(`/api/checks/${checkId}`, { cookie: other })).status).toBe(404);
  });
});
