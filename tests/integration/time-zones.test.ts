import { randomBytes } from 'node:crypto';
import { extractText, getDocumentProxy } from 'unpdf';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatDateTime } from '@/lib/domain/dates/format';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import { api, appDb, baseUrl, newInstallerCompany, postJson, signIn, waitForMail } from './helpers';

/*
 * A jurisdiction's time zone, end to end: set by an admin (bad names refused), listed by the API, and used
 * for the dates a person reads on a page, in the report e-mail and in the report PDF. The zone is one with
 * a half-hour offset, so a page that fell back to UTC or to whole hours could not pass.
 * tz database `northamerica`: America/St_Johns is UTC-3:30 in standard time, UTC-2:30 in daylight time;
 * Intl's en-US short name for it is the GMT offset (library behaviour).
 */

const db = appDb();
const ZONE = 'America/St_Johns';
const editions = { building: 'IRC 2021', electrical: 'NEC 2023', plumbing: 'IPC 2021', plumbingFamily: 'IPC', mechanical: 'IMC 2021', fuelGas: 'IFGC 2021' };
let admin: string;

beforeAll(async () => {
  admin = await signIn('admin@nookpass.demo');
});
afterAll(async () => {
  await db.destroy();
});

async function html(path: string, cookie?: string): Promise<string> {
  const res = await fetch(`${baseUrl}${path}`, { headers: cookie ? { cookie } : {}, redirect: 'manual' });
  expect(res.status, path).toBe(200);
  return res.text();
}

describe('a jurisdiction’s time zone', () => {
  const tag = randomBytes(4).toString('hex');
  const slug = `it-tz-${tag}`;
  const inspectorEmail = `tz-inspector-${tag}@example.test`;

  it('is refused with a 400 naming timeZone when it is not an IANA zone', { timeout: 120_000 }, async () => {
    const base = { slug, name: `IT time zone ${tag} (test)`, region: 'Test State (invented)', editions, inspectorEmail, amendmentNotes: '', startFrom: 'baseline' };
    for (const bad of ['Mars/Olympus_Mons', 'EST', '+05:30', '']) {
      const res = await api('/api/jurisdictions', postJson({ ...base, timeZone: bad }, { cookie: admin }));
      expect(res.status, bad).toBe(400);
      expect(res.body.errors, bad).toEqual([expect.objectContaining({ path: 'timeZone' })]);
    }
    expect(await db.selectFrom('jurisdictions').select('id').where('slug', '=', slug).executeTakeFirst()).toBeUndefined();

    const created = await api('/api/jurisdictions', postJson({ ...base, timeZone: ZONE, publishChangelog: 'Version 1 (test).', confirm: true }, { cookie: admin }));
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    expect(created.body.jurisdiction.timeZone).toBe(ZONE);

    // Changing it: a bad name changes nothing; an IANA alias is kept as written.
    const patch = (timeZone: string) => api(`/api/jurisdictions/${slug}`, postJson({ timeZone }, { cookie: admin, method: 'PATCH' }));
    const refused = await patch('Atlantis/Capital');
    expect(refused.status).toBe(400);
    expect(refused.body.errors).toEqual([{ path: 'timeZone', message: expect.stringContaining('Atlantis/Capital') }]);
    const alias = await patch('Asia/Kolkata');
    expect(alias.status, JSON.stringify(alias.body)).toBe(200);
    expect(alias.body.timeZone).toBe('Asia/Kolkata');
    expect((await patch(ZONE)).body.timeZone).toBe(ZONE);
    // The admin's jurisdiction page shows it and offers it among the zones.
    const page = await html(`/jurisdictions/${slug}`, admin);
    expect(page).toContain(`<strong>${ZONE}</strong>`);
    expect(page).toContain(`<option value="${ZONE}">`);
  });

  it('is listed by GET /api/jurisdictions, the demo jurisdictions with theirs', { timeout: 60_000 }, async () => {
    const company = await newInstallerCompany(db, 'tz-list');
    const res = await api('/api/jurisdictions', { cookie: company.cookie });
    expect(res.status).toBe(200);
    const bySlug = new Map((res.body as { slug: string; timeZone: string }[]).map((j) => [j.slug, j.timeZone]));
    expect(bySlug.get(slug)).toBe(ZONE);
    expect(bySlug.get('demo-county')).toBe('America/Denver');
    expect(bySlug.get('demo-city')).toBe('America/Chicago');
  });

  it('dates the check on the page, in the report e-mail and in the report PDF on the jurisdiction’s clock', { timeout: 120_000 }, async () => {
    const company = await newInstallerCompany(db, 'tz');
    const p = await api('/api/projects', postJson({ name: `Zone closet ${tag} (test)`, siteAddress: '1 Clock Lane', jurisdiction: slug }, { cookie: company.cookie }));
    expect(p.status, JSON.stringify(p.body)).toBe(201);
    expect((await api(`/api/projects/${p.body.id}/plans`, postJson({ plan: hallClosetPassPlan }, { cookie: company.cookie }))).status).toBe(201);
    const check = await api(`/api/projects/${p.body.id}/checks`, postJson({}, { cookie: company.cookie }));
    expect(check.status, JSON.stringify(check.body)).toBe(201);
    const checkedAt = (await db.selectFrom('checks').select('created_at').where('id', '=', check.body.id).executeTakeFirstOrThrow()).created_at;
    const expected = formatDateTime(checkedAt, ZONE);
    // Whichever side of the daylight-saving change the test runs on, the offset is a half hour, never UTC.
    expect(expected).toMatch(/ GMT-[23]:30$/);

    const page = await html(`/projects/${p.body.id}/checks/${check.body.id}`, company.cookie);
    expect(page).toContain(expected);
    const projectPage = await html(`/projects/${p.body.id}`, company.cookie);
    expect(projectPage).toContain(expected);

    const sent = await api(`/api/checks/${check.body.id}/send`, postJson({ confirmFailingFindings: true }, { cookie: company.cookie }));
    expect(sent.status, JSON.stringify(sent.body)).toBe(201);
    expect(sent.body.toInspector).toBe(true);
    const code = sent.body.report.code as string;

    // The e-mail goes out through the outbox: wait for the job to deliver it.
    const [mail] = await waitForMail((m) => m.to.includes(inspectorEmail) && m.subject.includes(code));
    expect(mail!.text).toContain(`Checked ${expected}; report issued `);
    expect(mail!.text).not.toMatch(/\bUTC\b/);

    const pdf = await fetch(`${baseUrl}/api/reports/${code}/pdf`, { headers: { cookie: company.cookie } });
    expect(pdf.status).toBe(200);
    const doc = await getDocumentProxy(new Uint8Array(await pdf.arrayBuffer()));
    const text = (await extractText(doc, { mergePages: true })).text.replace(/\s+/g, ' ');
    expect(text).toContain(expected);
    expect(text).toContain(`(times in ${ZONE})`);
    expect(text).not.toMatch(/\bUTC\b/);

    // The public verification page dates the report the same way.
    expect(await html(`/verify/${code}`)).toContain(expected);
  });
});
