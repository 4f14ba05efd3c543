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

beforeAll(async () => {
  installer = await signIn('installer@nookpass.demo');
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
});
