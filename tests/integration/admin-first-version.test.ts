import { randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { api, appDb, postJson, signIn } from './helpers';

// A throwaway jurisdiction whose first draft stays unpublished: what the admin sees before anything is published.
const db = appDb();
let admin: string;
const editions = { building: 'IRC 2021', electrical: 'NEC 2023', plumbing: 'IPC 2021', plumbingFamily: 'IPC', mechanical: 'IMC 2021', fuelGas: 'IFGC 2021' };
// IRC 2021 M1502.4.6.1: 35 ft. The invented local amendment lowers it to 20 ft, under the hall-closet
// demo plan's 22 ft 3 in developed length (IRC Table M1502.4.6.1 fitting equivalents).
const LOCAL_MAX_IN = 20 * 12;

beforeAll(async () => {
  admin = await signIn('admin@nookpass.demo');
});
afterAll(async () => {
  await db.destroy();
});

async function firstDraft() {
  const slug = `it-first-${randomBytes(4).toString('hex')}`;
  const res = await api(
    '/api/jurisdictions',
    postJson({ slug, name: 'IT first version (test)', region: 'Test State (invented)', editions, inspectorEmail: '', amendmentNotes: '', startFrom: 'baseline' }, { cookie: admin }),
  );
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return { slug, draft: res.body.draft as { id: string; version: number } };
}

describe('a first version, before anything is published', () => {
  it('dry-runs against the model-code baseline: an unchanged draft changes nothing, an amendment shows as a change, not as new rules', { timeout: 120_000 }, async () => {
    const { draft } = await firstDraft();
    const unchanged = await api(`/api/rule-sets/${draft.id}/dry-run`, postJson({}, { cookie: admin }));
    expect(unchanged.status).toBe(200);
    expect(unchanged.body.published).toBeNull();
    expect(unchanged.body.comparedWith).toMatchObject({ kind: 'baseline' });
    expect(unchanged.body.comparedWith.editions).toContain('IRC 2021');
    for (const s of unchanged.body.subjects) {
      expect(s.before, s.name).not.toBeNull();
      expect(s.changes, s.name).toEqual([]);
    }
    expect(unchanged.body.totals.changed).toBe(0);

    const set = (await api(`/api/rule-sets/${draft.id}`, { cookie: admin })).body;
    const saved = await api(
      `/api/rule-sets/${draft.id}`,
      postJson(
        { revision: set.revision, parameters: { ...set.parameters, exhaust: { ...set.parameters.exhaust, maxDevelopedLengthIn: LOCAL_MAX_IN }, amendments: [{ parameter: 'exhaust.maxDevelopedLengthIn', citation: 'Ord. IT-1 §2 (test)' }] } },
        { cookie: admin, method: 'PATCH' },
      ),
    );
    expect(saved.status, JSON.stringify(saved.body)).toBe(200);
    const amended = await api(`/api/rule-sets/${draft.id}/dry-run`, postJson({}, { cookie: admin }));
    const hall = amended.body.subjects.find((s: { id: string }) => s.id === 'demo-hall-closet');
    // Changes, never "new rule": every change has a baseline side. (The concealed-length label rule may follow
    // the length: IRC 2021 M1502.4.7 asks for it where the length exceeds the maximum.)
    for (const c of hall.changes) expect(c.from, c.ruleKey).not.toBeNull();
    expect(hall.changes.find((c: { ruleKey: string }) => c.ruleKey === 'exhaust.developed-length')).toMatchObject({ ruleKey: 'exhaust.developed-length', statusChanged: true, from: { status: 'pass', limit: `35' 0"` }, to: { status: 'fail', limit: `20' 0"` } });
  });

  it('shows the diff page against the baseline, naming the changed parameter in feet and inches', { timeout: 120_000 }, async () => {
    const { slug, draft } = await firstDraft();
    const set = (await api(`/api/rule-sets/${draft.id}`, { cookie: admin })).body;
    await api(
      `/api/rule-sets/${draft.id}`,
      postJson(
        { revision: set.revision, parameters: { ...set.parameters, exhaust: { ...set.parameters.exhaust, maxDevelopedLengthIn: LOCAL_MAX_IN }, amendments: [{ parameter: 'exhaust.maxDevelopedLengthIn', citation: 'Ord. IT-1 §2 (test)' }] } },
        { cookie: admin, method: 'PATCH' },
      ),
    );
    for (const path of [`/rules/${slug}/diff`, `/rules/${slug}/diff?from=baseline&to=${draft.version}`]) {
      const page = await api(path, { cookie: admin });
      expect(page.status, path).toBe(200);
    }
    const page = await api(`/rules/${slug}/diff?from=baseline&to=${draft.version}`, { cookie: admin });
    const html = String(page.body);
    expect(html).toContain('Maximum developed length');
    expect(html).toMatch(/35&#x27; 0&quot;|35' 0"/);
    expect(html).not.toContain('This page could not be shown');
  });
});
