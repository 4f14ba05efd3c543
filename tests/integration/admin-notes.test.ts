import { randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { LOCAL_SECTION_ADMIN_NOTE } from '@/lib/domain/rule-format';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import { api, appDb, baseUrl, postJson, signIn } from './helpers';

/*
 * A check stored at version 2, when a finding could carry a note meant for the rule set's admin, inserted
 * straight into the database and read back as the installer reads it: the API and the check page say what
 * to do on the job, never what to fix in the rule set.
 */
const db = appDb();
let installer: string;
let admin: string;

beforeAll(async () => {
  [installer, admin] = await Promise.all([signIn('installer@nookpass.demo'), signIn('admin@nookpass.demo')]);
});
afterAll(async () => {
  await db.destroy();
});

describe('admin notes never reach installers', () => {
  it('an old check whose finding held the admin note reads, on the API and the check page, with what to do instead', async () => {
    const project = await api('/api/projects', postJson({ name: `IT admin notes ${Math.random().toString(36).slice(2)}`, siteAddress: '9 Integration Way', jurisdiction: 'demo-county' }, { cookie: installer }));
    expect(project.status).toBe(201);
    expect((await api(`/api/projects/${project.body.id}/plans`, postJson({ plan: hallClosetPassPlan }, { cookie: installer }))).status).toBe(201);
    const fresh = await api(`/api/projects/${project.body.id}/checks`, postJson({}, { cookie: installer }));
    expect(fresh.status).toBe(201);
    expect(JSON.stringify(fresh.body)).not.toContain('rule set parameters');

    const row = await db.selectFrom('checks').selectAll().where('id', '=', fresh.body.id).executeTakeFirstOrThrow();
    const findings = (row.findings as Array<Record<string, unknown>>).map((f) =>
      f.ruleKey === 'plumbing.drain-pan' ? { ...f, citationNote: LOCAL_SECTION_ADMIN_NOTE, note: `${String(f.note)} ${LOCAL_SECTION_ADMIN_NOTE}` } : f,
    );
    const { id: _id, created_at: _at, ...rest } = row;
    const old = await db
      .insertInto('checks')
      .values({ ...rest, inputs: JSON.stringify(row.inputs), facts: JSON.stringify(row.facts), summary: JSON.stringify(row.summary), findings: JSON.stringify(findings), schema_version: 2 })
      .returning('id')
      .executeTakeFirstOrThrow();

    const read = await api(`/api/checks/${old.id}`, { cookie: installer });
    expect(read.status).toBe(200);
    expect(JSON.stringify(read.body)).not.toContain('rule set parameters');
    const pan = (read.body.findings as Array<{ ruleKey: string; citationNote: string | null }>).find((f) => f.ruleKey === 'plumbing.drain-pan');
    expect(pan?.citationNote).toContain('the AHJ can say which section applies');

    const page = await fetch(`${baseUrl}/projects/${project.body.id}/checks/${old.id}`, { headers: { cookie: installer } });
    expect(page.status).toBe(200);
    const html = await page.text();
    expect(html).not.toContain('rule set parameters');
    expect(html).toContain('the AHJ can say which section applies');
  }, 180_000);

  it('the evaluation API answers installers without admin notes; the admin’s dry run lists them', async () => {
    const evaluation = await api('/api/evaluations', postJson({ jurisdiction: 'demo-county', plan: hallClosetPassPlan }, { cookie: installer }));
    expect(evaluation.status).toBe(200);
    expect(JSON.stringify(evaluation.body)).not.toContain('rule set parameters');
    expect(evaluation.body.findings.some((f: Record<string, unknown>) => 'adminNote' in f)).toBe(false);

    // A throwaway jurisdiction's first draft, from the baseline: its local-amendment rules have no section entered yet.
    const slug = `it-notes-${randomBytes(4).toString('hex')}`;
    const editions = { building: 'IRC 2018', electrical: 'NEC 2017', plumbing: 'IPC 2018', plumbingFamily: 'IPC', mechanical: 'IMC 2018', fuelGas: 'IFGC 2018' };
    const made = await api(
      '/api/jurisdictions',
      postJson({ slug, name: `IT notes (test)`, region: 'Test State (invented)', editions, inspectorEmail: '', amendmentNotes: 'Throwaway test jurisdiction.', startFrom: 'baseline' }, { cookie: admin }),
    );
    expect(made.status, JSON.stringify(made.body)).toBe(201);
    const dry = await api(`/api/rule-sets/${made.body.draft.id}/dry-run`, postJson({}, { cookie: admin }));
    expect(dry.status).toBe(200);
    expect(dry.body.adminNotes).toContainEqual({ ruleKey: 'plumbing.drain-pan', title: expect.any(String), note: LOCAL_SECTION_ADMIN_NOTE });
    expect(JSON.stringify(dry.body.subjects)).not.toContain('rule set parameters');
  }, 180_000);
});
