import { createHash, randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import { api, appDb, baseUrl, postJson, signIn } from './helpers';

/*
 * Public report lookups: codes long enough not to be guessed, the codes issued before still verifying,
 * and a per-address limit on the facts API, the verification POST and the /verify page.
 */

const db = appDb();
let installer: string;
let checkId: string;
let code: string;
const PROJECT = `Lookup closet ${randomBytes(3).toString('hex')} (test)`;

// Each test looks up from an address of its own (RFC 3849 documentation prefix), sent the way the nearest
// proxy would (lib/platform/rate-limit reads the right-most X-Forwarded-For entry), so these lookups neither
// use up nor depend on what other test files spend from the loopback address.
const newClient = () => `2001:db8::${randomBytes(8).toString('hex').match(/.{4}/g)!.join(':')}`;

const SYMBOL = '[2-9A-HJ-NP-Z]'; // lib/domain/reports/code.ts: no 0, O, 1, I
const LIMIT = 60; // lib/services/reports/limits.ts REPORT_LOOKUP_LIMIT: 60 a minute per address

function lookup(kind: 'api' | 'verify' | 'page', reportCode: string, client: string) {
  const headers = { 'x-forwarded-for': client };
  if (kind === 'api') return fetch(`${baseUrl}/api/reports/${reportCode}`, { headers });
  if (kind === 'verify') return fetch(`${baseUrl}/api/reports/${reportCode}/verify`, { method: 'POST', headers: { ...headers, 'content-type': 'application/pdf' }, body: '%PDF-1.7 not the report' });
  return fetch(`${baseUrl}/verify/${reportCode}`, { headers });
}

beforeAll(async () => {
  installer = await signIn('installer@nookpass.demo');
  const p = await api('/api/projects', postJson({ name: PROJECT, siteAddress: '12 Lookup Lane', jurisdiction: 'demo-county' }, { cookie: installer }));
  expect(p.status).toBe(201);
  expect((await api(`/api/projects/${p.body.id}/plans`, postJson({ plan: hallClosetPassPlan }, { cookie: installer }))).status).toBe(201);
  checkId = (await api(`/api/projects/${p.body.id}/checks`, postJson({}, { cookie: installer }))).body.id;
  const res = await fetch(`${baseUrl}/api/checks/${checkId}/report`, { method: 'POST', headers: { cookie: installer } });
  await res.arrayBuffer();
  code = res.headers.get('x-report-code')!;
}, 60_000);

afterAll(async () => {
  await db.destroy();
});

describe('report codes', () => {
  it('are issued with 80 random bits and still verify when issued before with 40', async () => {
    // 16 symbols of a 32-symbol alphabet: 16 × log2(32) = 80 bits.
    expect(code).toMatch(new RegExp(`^NP(-${SYMBOL}{4}){4}$`));
    const client = newClient();
    expect((await lookup('api', code.toLowerCase(), client)).status).toBe(200);

    // A report issued under the earlier 8-symbol scheme (rows inserted today carry a snapshot; the database insists).
    const legacySnapshot = {
      schemaVersion: 1,
      project: { name: PROJECT, siteAddress: '12 Lookup Lane', permitNumber: null, isDemo: false },
      jurisdiction: { slug: 'demo-county', name: 'Demo County' },
      company: { name: 'Demo Closet Works', licenseNumber: null },
      ruleSet: { version: 1 },
      check: { checkedAt: new Date().toISOString(), summary: { pass: 1, fail: 0, caution: 0, needsInfo: 0, notApplicable: 0 }, outcome: 'pass' },
    };
    const alphabet = '23456789ABCDEFGHJKLMNPQRSTUVWXYZ';
    const legacy = `NP-${[...randomBytes(8)].map((b, i) => (i === 4 ? '-' : '') + alphabet[b & 31]).join('')}`;
    const bytes = Buffer.from(`%PDF-1.4 legacy report ${legacy}`);
    await db
      .insertInto('reports')
      .values({ check_id: checkId, code: legacy, sha256: createHash('sha256').update(bytes).digest('hex'), byte_size: bytes.length, page_count: 1, storage_key: `reports/legacy/${legacy}.pdf`, attachment_ids: '[]', snapshot: JSON.stringify(legacySnapshot), schema_version: 0 })
      .execute();
    const facts = await api(`/api/reports/${legacy}`, { headers: { 'x-forwarded-for': client } });
    expect(facts.status).toBe(200);
    expect(facts.body.code).toBe(legacy);
    const verify = await fetch(`${baseUrl}/api/reports/${legacy}/verify`, { method: 'POST', headers: { 'x-forwarded-for': client }, body: new Uint8Array(bytes) });
    expect(await verify.json()).toMatchObject({ code: legacy, genuine: true });
    const page = (await (await lookup('page', legacy, client)).text()).replace(/<!-- -->/g, '');
    expect(page).toContain(`Report ${legacy} was issued by NookPass`);
  });
});

describe('lookup limits', () => {
  it(`answer ${LIMIT} lookups a minute from one address, then 429 with Retry-After, and the page says why`, { timeout: 60_000 }, async () => {
    const client = newClient();
    // Spread over the three ways to look a report up, misses included: all count alike.
    const kinds = [...Array(18).fill('api'), 'miss', 'miss', ...Array(20).fill('verify'), ...Array(20).fill('page')] as const;
    expect(kinds).toHaveLength(LIMIT);
    const statuses: number[] = [];
    for (let i = 0; i < kinds.length; i += 10) {
      const batch = kinds.slice(i, i + 10).map(async (kind) => {
        const res = kind === 'miss' ? await lookup('api', 'NP-2222-2222-2222-2222', client) : await lookup(kind, code, client);
        await res.arrayBuffer();
        return res.status;
      });
      statuses.push(...(await Promise.all(batch)));
    }
    expect(statuses.filter((s) => s === 200)).toHaveLength(LIMIT - 2);
    expect(statuses.filter((s) => s === 404)).toHaveLength(2);

    const refused = await lookup('api', code, client);
    expect(refused.status).toBe(429);
    // RFC 6585 §4 (429) with RFC 9110 §10.2.3 Retry-After in seconds, within the one-minute window.
    const retryAfter = Number(refused.headers.get('retry-after'));
    expect(retryAfter).toBeGreaterThanOrEqual(1);
    expect(retryAfter).toBeLessThanOrEqual(60);
    expect((await refused.json()).error).toMatch(/Too many report lookups/);
    expect((await lookup('verify', code, client)).status).toBe(429);
    const page = await lookup('page', code, client);
    const html = await page.text();
    expect(html).toContain('Too many lookups for now');
    expect(html).not.toContain(PROJECT);

    // Another address is not held back by this one.
    expect((await lookup('api', code, newClient())).status).toBe(200);
  });
});
