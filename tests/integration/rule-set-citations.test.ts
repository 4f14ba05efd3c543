import { randomBytes } from 'node:crypto';
import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { longExhaustFailPlan } from '@/tests/fixtures/plans';
import { api, appDb, postJson, signIn } from './helpers';

// Throwaway jurisdictions made through the admin API; the demo jurisdictions are never touched.
const db = appDb();
let admin: string;
let installer: string;
let inspector: string;

const editions = { building: 'IRC 2021', electrical: 'NEC 2023', plumbing: 'IPC 2021', plumbingFamily: 'IPC', mechanical: 'IMC 2021', fuelGas: 'IFGC 2021' };
const FT = 12;
// IRC 2021 M1502.4.6.1: 35 ft maximum developed length (TRADE.md, V); the amendment to 30 ft is invented.
const MODEL_MAX_IN = 35 * FT;
const LOCAL_MAX_IN = 30 * FT;
const ORDINANCE = 'Ord. 12-34 §2 (test)';

const body = (slug: string, extra: Record<string, unknown> = {}) => ({
  slug, name: `IT ${slug} (test)`, region: 'Test State (invented)', editions, inspectorEmail: '', amendmentNotes: 'Throwaway test jurisdiction.', startFrom: 'baseline', ...extra,
});
const slug = (tag: string) => `it-${tag}-${randomBytes(4).toString('hex')}`;
const paths = (res: { body: { errors?: { path: string }[] } }) => (res.body.errors ?? []).map((e) => e.path);

async function draftOf(tag: string) {
  const s = slug(tag);
  const res = await api('/api/jurisdictions', postJson(body(s), { cookie: admin }));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return { slug: s, draft: res.body.draft as { id: string; version: number; revision: number } };
}

async function loadSet(id: string) {
  const res = await api(`/api/rule-sets/${id}`, { cookie: admin });
  expect(res.status).toBe(200);
  return res.body;
}

async function citations(id: string, cookie = admin) {
  return api(`/api/rule-sets/${id}/citations`, { cookie });
}

beforeAll(async () => {
  [admin, installer, inspector] = await Promise.all([signIn('admin@nookpass.demo'), signIn('installer@nookpass.demo'), signIn('inspector@nookpass.demo')]);
});
afterAll(async () => {
  await db.destroy();
});

describe('adopted editions are checked for consistency when saved', () => {
  it('refuses a UPC edition under the IPC family on create, naming editions.plumbing, and saves nothing', async () => {
    const s = slug('upc-ipc');
    // UPC 804.1 (18–30 in) vs IPC/IRC (18–42 in): TRADE.md, plumbing.
    const res = await api('/api/jurisdictions', postJson(body(s, { editions: { ...editions, plumbing: 'UPC 2024' } }), { cookie: admin }));
    expect(res.status).toBe(400);
    expect(paths(res)).toEqual(['editions.plumbing']);
    expect(res.body.errors[0].message).toMatch(/UPC 2024 is a UPC edition, but the plumbing family is IPC/);
    expect(await db.selectFrom('jurisdictions').select('id').where('slug', '=', s).executeTakeFirst()).toBeUndefined();
  });

  it('refuses a code in the wrong slot on edit, and only admins may edit', async () => {
    const { slug: s } = await draftOf('edit-editions');
    const wrong = await api(`/api/jurisdictions/${s}`, postJson({ editions: { ...editions, electrical: 'IRC 2021' } }, { cookie: admin, method: 'PATCH' }));
    expect(wrong.status).toBe(400);
    expect(paths(wrong)).toEqual(['editions.electrical']);
    const mismatchedIrc = await api(`/api/jurisdictions/${s}`, postJson({ editions: { ...editions, fuelGas: 'IRC 2018' } }, { cookie: admin, method: 'PATCH' }));
    expect(paths(mismatchedIrc)).toEqual(['editions.fuelGas']);
    const fine = await api(`/api/jurisdictions/${s}`, postJson({ editions: { ...editions, plumbing: 'UPC 2021', plumbingFamily: 'UPC' } }, { cookie: admin, method: 'PATCH' }));
    expect(fine.status, JSON.stringify(fine.body)).toBe(200);
    expect((await api(`/api/jurisdictions/${s}`, postJson({ editions }, { cookie: installer, method: 'PATCH' }))).status).toBe(403);
  });
});

describe('a changed model value carries its local amendment', () => {
  it('refuses 35 ft → 30 ft without a citation, accepts it with one, and the finding cites both', { timeout: 120_000 }, async () => {
    const { slug: s, draft } = await draftOf('amend');
    const set = await loadSet(draft.id);
    expect(set.parameters.amendments).toEqual([]);
    const shorter = { ...set.parameters, exhaust: { ...set.parameters.exhaust, maxDevelopedLengthIn: LOCAL_MAX_IN } };
    const uncited = await api(`/api/rule-sets/${draft.id}`, postJson({ revision: draft.revision, parameters: shorter }, { cookie: admin, method: 'PATCH' }));
    expect(uncited.status).toBe(400);
    expect(paths(uncited)).toEqual(['parameters.exhaust.maxDevelopedLengthIn']);
    expect((await loadSet(draft.id)).parameters.exhaust.maxDevelopedLengthIn).toBe(MODEL_MAX_IN); // nothing saved
    const notAParameter = await api(`/api/rule-sets/${draft.id}`, postJson({ revision: draft.revision, parameters: { ...shorter, amendments: [{ parameter: 'exhaust.nothing', citation: ORDINANCE }] } }, { cookie: admin, method: 'PATCH' }));
    expect(paths(notAParameter)).toEqual(expect.arrayContaining(['parameters.amendments.0.parameter', 'parameters.exhaust.maxDevelopedLengthIn']));
    const blank = await api(`/api/rule-sets/${draft.id}`, postJson({ revision: draft.revision, parameters: { ...shorter, amendments: [{ parameter: 'exhaust.maxDevelopedLengthIn', citation: '  ' }] } }, { cookie: admin, method: 'PATCH' }));
    expect(paths(blank)).toEqual(['parameters.amendments.0.citation']);
    const installerSave = await api(`/api/rule-sets/${draft.id}`, postJson({ revision: draft.revision, parameters: shorter }, { cookie: installer, method: 'PATCH' }));
    expect(installerSave.status).toBe(403);

    const cited = await api(`/api/rule-sets/${draft.id}`, postJson({ revision: draft.revision, parameters: { ...shorter, amendments: [{ parameter: 'exhaust.maxDevelopedLengthIn', citation: ORDINANCE }] } }, { cookie: admin, method: 'PATCH' }));
    expect(cited.status, JSON.stringify(cited.body)).toBe(200);
    const published = await api(`/api/rule-sets/${draft.id}/publish`, postJson({ revision: cited.body.revision, changelog: `Local amendment ${ORDINANCE}: 30 ft.`, confirm: true }, { cookie: admin }));
    expect(published.status, JSON.stringify(published.body)).toBe(200);

    const project = await api('/api/projects', postJson({ name: `IT amendment ${s}`, siteAddress: '1 Test Way (invented)', jurisdiction: s }, { cookie: installer }));
    expect(project.status).toBe(201);
    expect((await api(`/api/projects/${project.body.id}/plans`, postJson({ plan: longExhaustFailPlan }, { cookie: installer }))).status).toBe(201);
    const check = await api(`/api/projects/${project.body.id}/checks`, postJson({}, { cookie: installer }));
    expect(check.status).toBe(201);
    const length = check.body.findings.find((f: { ruleKey: string }) => f.ruleKey === 'exhaust.developed-length');
    expect(length).toMatchObject({
      citation: { code: 'IRC', edition: '2021', section: 'M1502.4.6.1' }, // the model section
      amendments: [{ parameter: 'exhaust.maxDevelopedLengthIn', citation: ORDINANCE, modelValue: MODEL_MAX_IN, value: LOCAL_MAX_IN }],
      display: { limit: `30' 0"` },
    });
    expect(length.note).toContain(ORDINANCE);
    // Read back as stored, the check keeps the amendment.
    const stored = await api(`/api/checks/${check.body.id}`, { cookie: installer });
    expect(stored.body.findings.find((f: { ruleKey: string }) => f.ruleKey === 'exhaust.developed-length').amendments[0].citation).toBe(ORDINANCE);
  });
});

describe('citations checked against the adopted text', () => {
  it('marks, withdraws and refuses bad marks, naming the field; only admins', async () => {
    const { draft } = await draftOf('marks');
    const list = await citations(draft.id);
    expect(list.status).toBe(200);
    expect(list.body.uncheckedMemory.length).toBeGreaterThan(0);
    const url = `/api/rule-sets/${draft.id}/citations`;

    const noAgainst = await api(url, postJson({ ruleKey: 'exhaust.developed-length', checked: true }, { cookie: admin }));
    expect(noAgainst.status).toBe(400);
    expect(paths(noAgainst)).toEqual(['against']);
    const unknown = await api(url, postJson({ ruleKey: 'exhaust.no-such-rule', checked: true, against: '2021 IRC as adopted' }, { cookie: admin }));
    expect(paths(unknown)).toEqual(['ruleKey']);
    const tooLong = await api(url, postJson({ ruleKey: 'exhaust.developed-length', checked: true, against: 'x'.repeat(301) }, { cookie: admin }));
    expect(paths(tooLong)).toEqual(['against']);
    const extra = await api(url, postJson({ ruleKey: 'exhaust.developed-length', checked: true, against: 'x', checkedAt: '2001-01-01' }, { cookie: admin }));
    expect(extra.status).toBe(400); // nobody chooses the date of a mark
    const maker = list.body.citations.find((c: { checkable: boolean }) => !c.checkable);
    if (maker) expect(paths(await api(url, postJson({ ruleKey: maker.ruleKey, checked: true, against: 'the maker' }, { cookie: admin })))).toEqual(['ruleKey']);
    for (const cookie of [installer, inspector]) {
      expect((await api(url, postJson({ ruleKey: 'exhaust.developed-length', checked: true, against: 'x' }, { cookie }))).status).toBe(403);
      expect((await citations(draft.id, cookie)).status).toBe(403);
    }
    expect((await api(url, postJson({ ruleKey: 'exhaust.developed-length', checked: true, against: 'x' }))).status).toBe(401);

    const before = Date.now();
    const mark = await api(url, postJson({ ruleKey: 'exhaust.developed-length', checked: true, against: '2021 IRC as adopted by ordinance 12-34 (test)' }, { cookie: admin }));
    expect(mark.status, JSON.stringify(mark.body)).toBe(201);
    expect(mark.body).toMatchObject({ ruleKey: 'exhaust.developed-length', citation: 'IRC 2021 M1502.4.6.1', checked: true, against: '2021 IRC as adopted by ordinance 12-34 (test)', checkedBy: 'Casey Demo (admin)' });
    expect(new Date(mark.body.checkedAt).getTime()).toBeGreaterThanOrEqual(before - 5_000);
    const withdrawn = await api(url, postJson({ ruleKey: 'exhaust.developed-length', checked: false }, { cookie: admin }));
    expect(withdrawn.body).toMatchObject({ checked: false });
    const rows = await db.selectFrom('citation_checks').select(['checked']).where('rule_set_id', '=', draft.id).orderBy('id').execute();
    expect(rows.map((r) => r.checked)).toEqual([true, false]); // both kept

    // The database keeps the marks append-only and refuses marks on a version that is not a draft.
    await expect(db.updateTable('citation_checks').set({ checked_against: 'rewritten' }).where('rule_set_id', '=', draft.id).execute()).rejects.toThrow(/append-only/);
    await expect(db.deleteFrom('citation_checks').where('rule_set_id', '=', draft.id).execute()).rejects.toThrow(/append-only/);
    await expect(sql`TRUNCATE citation_checks`.execute(db)).rejects.toThrow();
  });

  it('asks to confirm publishing unchecked from-memory citations, lists them, and carries checks into the next draft', { timeout: 120_000 }, async () => {
    const { slug: s, draft } = await draftOf('confirm');
    const list = (await citations(draft.id)).body as { uncheckedMemory: { ruleKey: string; citation: string }[] };
    const unconfirmed = await api(`/api/rule-sets/${draft.id}/publish`, postJson({ revision: draft.revision, changelog: 'Version 1 (test).' }, { cookie: admin }));
    expect(unconfirmed.status).toBe(409);
    expect(unconfirmed.body.needsConfirmation).toBe(true);
    expect(paths(unconfirmed)).toEqual(['confirm']);
    for (const u of list.uncheckedMemory) expect(unconfirmed.body.error).toContain(`${u.ruleKey} (${u.citation})`);
    expect((await loadSet(draft.id)).status).toBe('draft'); // nothing published

    // Checking them all lets the draft publish without a confirmation.
    for (const u of list.uncheckedMemory) {
      const res = await api(`/api/rule-sets/${draft.id}/citations`, postJson({ ruleKey: u.ruleKey, checked: true, against: '2021 codes as adopted by ordinance 12-34 (test)' }, { cookie: admin }));
      expect(res.status, JSON.stringify(res.body)).toBe(201);
    }
    expect((await citations(draft.id)).body.uncheckedMemory).toEqual([]);
    const published = await api(`/api/rule-sets/${draft.id}/publish`, postJson({ revision: draft.revision, changelog: 'Version 1 (test): citations checked.' }, { cookie: admin }));
    expect(published.status, JSON.stringify(published.body)).toBe(200);

    // A published version takes no marks; the next draft starts with the checks carried over.
    const late = await api(`/api/rule-sets/${draft.id}/citations`, postJson({ ruleKey: 'exhaust.developed-length', checked: true, against: 'x' }, { cookie: admin }));
    expect(late.status).toBe(409);
    await expect(
      db.insertInto('citation_checks').values({ jurisdiction_id: (await db.selectFrom('rule_sets').select('jurisdiction_id').where('id', '=', draft.id).executeTakeFirstOrThrow()).jurisdiction_id, rule_set_id: draft.id, rule_key: 'exhaust.developed-length', citation: 'IRC 2021 M1502.4.6.1', checked: true, checked_against: 'x', checked_by: null, checked_by_name: 'x' }).execute(),
    ).rejects.toThrow(/marked on a draft/);
    const next = await api(`/api/jurisdictions/${s}/rule-sets`, postJson({ from: 'published' }, { cookie: admin }));
    expect(next.status).toBe(201);
    const carried = (await citations(next.body.id)).body as { uncheckedMemory: unknown[]; citations: { ruleKey: string; mark: { carriedFromVersion: number | null; checked: boolean } | null }[] };
    expect(carried.uncheckedMemory).toEqual([]);
    const first = carried.citations.find((c) => c.ruleKey === list.uncheckedMemory[0].ruleKey)!;
    expect(first.mark).toMatchObject({ checked: true, carriedFromVersion: 1 });

    // Re-publishing with a from-memory citation unchecked again, confirmed: the publish audit entry lists it.
    const again = next.body as { id: string; revision: number };
    await api(`/api/rule-sets/${again.id}/citations`, postJson({ ruleKey: list.uncheckedMemory[0].ruleKey, checked: false }, { cookie: admin }));
    const confirmed = await api(`/api/rule-sets/${again.id}/publish`, postJson({ revision: again.revision, changelog: 'Version 2 (test).', confirm: true }, { cookie: admin }));
    expect(confirmed.status, JSON.stringify(confirmed.body)).toBe(200);
    const entry = await db.selectFrom('audit_log').select('details').where('entity_id', '=', again.id).where('action', '=', 'rule-set.publish').executeTakeFirstOrThrow();
    expect((entry.details as { uncheckedConfirmed: { ruleKey: string }[] }).uncheckedConfirmed.map((u) => u.ruleKey)).toEqual([list.uncheckedMemory[0].ruleKey]);
  });
});

describe('rule sets stored before amendments were cited', () => {
  it('a version 1 row reads through the app with an empty amendment list and its values as stored', async () => {
    const s = slug('v1-params');
    const res = await api('/api/jurisdictions', postJson(body(s, { publishChangelog: 'Version 1 (test).', confirm: true }), { cookie: admin }));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const v1 = await loadSet(res.body.draft.id);
    const { amendments: _none, ...oldShape } = { ...v1.parameters, exhaust: { ...v1.parameters.exhaust, maxDevelopedLengthIn: LOCAL_MAX_IN } };
    const row = await db
      .insertInto('rule_sets')
      .values({ jurisdiction_id: res.body.jurisdiction.id, version: 2, parameters: JSON.stringify(oldShape), schema_version: 1, based_on_id: v1.id })
      .returning('id')
      .executeTakeFirstOrThrow();
    const read = await loadSet(row.id);
    expect(read.parameters.amendments).toEqual([]);
    expect(read.parameters.exhaust.maxDevelopedLengthIn).toBe(LOCAL_MAX_IN); // read, never rewritten
    const stored = await db.selectFrom('rule_sets').select(['schema_version', 'parameters']).where('id', '=', row.id).executeTakeFirstOrThrow();
    expect(stored.schema_version).toBe(1);
    expect('amendments' in (stored.parameters as object)).toBe(false);
  });
});
