import { randomBytes } from 'node:crypto';
import bcrypt from 'bcryptjs';
import sharp from 'sharp';
import { extractText, getDocumentProxy } from 'unpdf';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { longExhaustFailPlan } from '@/tests/fixtures/plans';
import { api, appDb, attemptSignIn, baseUrl, postJson, signIn, testAddress } from './helpers';

const db = appDb();
let installer: string;
let inspector: string;
let projectId: string;
let checkId: string;
let reportId: string;
let reportCode: string;

// Markup an attacker would like a page to run; it must come back as text.
const MARKUP_NAME = '<script>window.__np=1</script><img src=x onerror=alert(1)>';
const MARKUP_ADDRESS = '"><svg onload=alert(2)> 4 Markup Road';
const MARKUP_CAPTION = '<b onmouseover=alert(3)>caption</b>';
const MARKUP_COMMENT = '<iframe src=//evil.example></iframe> see finding';
// Strings that look like SQL; parameterised queries store them as typed.
const SQL_NOTES = "Robert'); DROP TABLE projects; -- and 1' OR '1'='1";

/** React escapes text as &lt; &gt; &quot; &#x27; &amp;: what a page must contain instead of the raw markup. */
function htmlEscaped(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#x27;');
}

async function page(path: string, cookie?: string): Promise<string> {
  const res = await fetch(`${baseUrl}${path}`, { headers: cookie ? { cookie } : {} });
  expect(res.status, path).toBe(200);
  return res.text();
}

async function freshUser(tag: string, password: string): Promise<string> {
  const email = `${tag}-${randomBytes(4).toString('hex')}@example.test`;
  const org = await db.selectFrom('organizations').select('id').where('name', '=', 'Demo Second Company').executeTakeFirstOrThrow();
  await db.insertInto('users').values({ email, name: `${tag} (test)`, role: 'installer', organization_id: org.id, password_hash: await bcrypt.hash(password, 4) }).execute();
  return email;
}

beforeAll(async () => {
  [installer, inspector] = await Promise.all([signIn('installer@nookpass.demo'), signIn('inspector@nookpass.demo')]);
  const p = await api('/api/projects', postJson({ name: MARKUP_NAME, siteAddress: MARKUP_ADDRESS, jurisdiction: 'demo-county', notes: SQL_NOTES }, { cookie: installer }));
  expect(p.status, JSON.stringify(p.body)).toBe(201);
  projectId = p.body.id;
  expect((await api(`/api/projects/${projectId}/plans`, postJson({ plan: longExhaustFailPlan }, { cookie: installer }))).status).toBe(201);
  checkId = (await api(`/api/projects/${projectId}/checks`, postJson({}, { cookie: installer }))).body.id;
  const form = new FormData();
  form.set('file', new Blob([new Uint8Array(await sharp({ create: { width: 40, height: 30, channels: 3, background: '#558844' } }).jpeg().toBuffer())], { type: 'image/jpeg' }), 'markup.jpg');
  form.set('caption', MARKUP_CAPTION);
  expect((await fetch(`${baseUrl}/api/projects/${projectId}/attachments`, { method: 'POST', headers: { cookie: installer }, body: form })).status).toBe(201);
  const sent = await api(`/api/checks/${checkId}/send`, postJson({ note: MARKUP_COMMENT, confirmFailingFindings: true }, { cookie: installer }));
  expect(sent.status, JSON.stringify(sent.body)).toBe(201);
  reportCode = sent.body.report.code;
  reportId = (await db.selectFrom('reports').select('id').where('code', '=', reportCode).executeTakeFirstOrThrow()).id;
  const review = await api(`/api/inspections/${reportId}/review`, postJson({ outcome: 'corrections-needed', comment: MARKUP_COMMENT }, { cookie: inspector }));
  expect(review.status, JSON.stringify(review.body)).toBe(201);
}, 90_000);

afterAll(async () => {
  await db.destroy();
});

describe('text holding markup', () => {
  it('is shown escaped on every page that shows it, never as markup', { timeout: 60_000 }, async () => {
    const pages: [string, string | undefined, string[]][] = [
      [`/projects/${projectId}`, installer, [MARKUP_NAME, MARKUP_ADDRESS, MARKUP_COMMENT]],
      ['/inspections', inspector, [MARKUP_NAME]],
      [`/inspections/${reportId}`, inspector, [MARKUP_NAME, MARKUP_ADDRESS, MARKUP_CAPTION]],
      [`/verify/${reportCode}`, undefined, [MARKUP_NAME]],
    ];
    for (const [path, cookie, texts] of pages) {
      const html = await page(path, cookie);
      for (const text of texts) {
        expect(html, `${path} must not carry ${text} as markup`).not.toContain(text);
        expect(html, `${path} shows ${text} as text`).toContain(htmlEscaped(text));
      }
      expect(html).not.toContain('<script>window.__np');
    }
    // The edit form and the client-sorted project table carry the values in their client payload; never as live markup.
    for (const path of [`/projects/${projectId}/edit`, '/projects']) {
      const html = await page(path, installer);
      for (const text of [MARKUP_NAME, MARKUP_ADDRESS]) expect(html, path).not.toContain(text);
    }
  });

  it('appears in the PDF report as the literal characters, not entities and not dropped', { timeout: 60_000 }, async () => {
    const res = await fetch(`${baseUrl}/api/checks/${checkId}/report`, { method: 'POST', headers: { cookie: installer } });
    expect(res.status).toBe(200);
    const doc = await getDocumentProxy(new Uint8Array(await res.arrayBuffer()));
    const { text } = await extractText(doc, { mergePages: true });
    const flat = text.replace(/\s+/g, '');
    // Compared without white space: the PDF's text layer breaks long lines wherever it likes.
    for (const literal of [MARKUP_NAME, MARKUP_ADDRESS, MARKUP_CAPTION]) expect(flat).toContain(literal.replace(/\s+/g, ''));
    expect(flat).not.toContain('&lt;');
  });
});

describe('strings that look like SQL', () => {
  it('are stored and returned exactly as typed', async () => {
    const row = await db.selectFrom('projects').select(['name', 'site_address', 'notes']).where('id', '=', projectId).executeTakeFirstOrThrow();
    expect(row).toEqual({ name: MARKUP_NAME, site_address: MARKUP_ADDRESS, notes: SQL_NOTES });
    const read = await api(`/api/projects/${projectId}`, { cookie: installer });
    expect(read.body.notes).toBe(SQL_NOTES);
    const renamed = await api(`/api/projects/${projectId}`, postJson({ notes: `${SQL_NOTES}; SELECT pg_sleep(5);` }, { cookie: installer, method: 'PATCH' }));
    expect(renamed.status).toBe(200);
    expect(renamed.body.notes).toBe(`${SQL_NOTES}; SELECT pg_sleep(5);`);
    expect(Number((await db.selectFrom('projects').select(db.fn.countAll<number>().as('n')).executeTakeFirstOrThrow()).n)).toBeGreaterThan(0);
  });

  it('in a search are matched as text and never widen it to other rows or companies', async () => {
    const other = await signIn('other-installer@nookpass.demo');
    for (const q of ["' OR '1'='1", "x' OR 1=1 --", "%' OR name LIKE '%"]) {
      const res = await api(`/api/projects?q=${encodeURIComponent(q)}`, { cookie: other });
      expect(res.status, q).toBe(200);
      expect(res.body.items, q).toEqual([]);
    }
    const tokenName = "tok'); DELETE FROM api_tokens; --";
    const email = await freshUser('sql-token', 'sql-token-pw-1');
    const cookie = await signIn(email, 'sql-token-pw-1');
    const created = await api('/api/tokens', postJson({ name: tokenName }, { cookie }));
    expect(created.status).toBe(201);
    expect((await api('/api/tokens', { cookie })).body.tokens.map((t: { name: string }) => t.name)).toEqual([tokenName]);
  });
});

describe('security headers', () => {
  it('come with pages, API answers, errors and file downloads alike', async () => {
    const attachments = await api(`/api/projects/${projectId}/attachments`, { cookie: installer });
    const targets: [string, string | undefined][] = [
      ['/', undefined],
      ['/sign-in', undefined],
      [`/projects/${projectId}`, installer],
      ['/api/health', undefined],
      ['/api/me', undefined], // 401
      ['/no-such-page', undefined], // 404
      [`/api/attachments/${attachments.body.attachments[0].id}`, installer],
      [`/api/reports/${reportCode}/pdf`, installer],
    ];
    for (const [path, cookie] of targets) {
      const res = await fetch(`${baseUrl}${path}`, { headers: cookie ? { cookie } : {}, redirect: 'manual' });
      await res.arrayBuffer();
      const csp = res.headers.get('content-security-policy') ?? '';
      // CSP Level 3 section 6.4.2: frame-ancestors 'none' forbids every embedding.
      expect(csp, path).toMatch(/(^|;)\s*frame-ancestors 'none'\s*(;|$)/);
      expect(csp, path).toMatch(/(^|;)\s*default-src 'self'\s*(;|$)/);
      expect(csp, path).toMatch(/(^|;)\s*object-src 'none'\s*(;|$)/);
      // OWASP Secure Headers Project: nosniff, so an upload is never run as a script or style.
      expect(res.headers.get('x-content-type-options'), path).toBe('nosniff');
      expect(res.headers.get('referrer-policy'), path).toBe('strict-origin-when-cross-origin');
      expect(res.headers.get('x-frame-options'), path).toBe('DENY'); // RFC 7034
      expect(res.headers.get('x-powered-by'), path).toBeNull();
    }
  });

  it('keep private API answers out of shared caches', async () => {
    const res = await fetch(`${baseUrl}/api/projects/${projectId}`, { headers: { cookie: installer } });
    // RFC 9111 section 5.2.2.5: no-store keeps the answer out of every cache.
    expect(res.headers.get('cache-control')).toMatch(/no-store/);
  });
});

describe('the session cookie over http', () => {
  it('is HttpOnly, SameSite=Lax, host-only and scoped to /', async () => {
    const csrf = await fetch(`${baseUrl}/api/auth/csrf`);
    const jar = csrf.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
    const { csrfToken } = (await csrf.json()) as { csrfToken: string };
    const email = await freshUser('cookie', 'cookie-pw-1');
    const res = await fetch(`${baseUrl}/api/auth/callback/credentials`, {
      method: 'POST',
      redirect: 'manual',
      headers: { 'content-type': 'application/x-www-form-urlencoded', cookie: jar },
      body: new URLSearchParams({ csrfToken, email, password: 'cookie-pw-1', json: 'true' }),
    });
    const session = res.headers.getSetCookie().find((c) => /next-auth\.session-token=/.test(c));
    expect(session).toBeDefined();
    const attrs = session!.split(';').slice(1).map((a) => a.trim().toLowerCase());
    // RFC 6265 section 4.1.2.6 (HttpOnly) and RFC 6265bis section 4.1.2.7 (SameSite).
    expect(attrs).toContain('httponly');
    expect(attrs).toContain('samesite=lax');
    expect(attrs).toContain('path=/');
    expect(attrs.some((a) => a.startsWith('domain='))).toBe(false);
    // This server's NEXTAUTH_URL is http; over https the same config switches to Secure and __Secure- (unit test).
    if (new URL(process.env.NEXTAUTH_URL ?? baseUrl).protocol === 'http:') expect(attrs).not.toContain('secure');
  });
});

describe('origin checks on cookie-authenticated writes', () => {
  it('refuse POST, PATCH, PUT and DELETE from another site, or from an opaque origin, and change nothing', { timeout: 60_000 }, async () => {
    const admin = await signIn('admin@nookpass.demo');
    // A user of its own for the token rows, so the ten-an-hour limit of a shared demo account never interferes.
    const tokenOwner = await signIn(await freshUser('origin-token', 'origin-token-pw'), 'origin-token-pw');
    const token = await api('/api/tokens', postJson({ name: 'origin check' }, { cookie: tokenOwner }));
    expect(token.status).toBe(201);
    const attachments = (await api(`/api/projects/${projectId}/attachments`, { cookie: installer })).body.attachments;
    const revisions = async () => (await api(`/api/projects/${projectId}/plans`, { cookie: installer })).body.revisions.length;
    const before = { revisions: await revisions(), notes: (await api(`/api/projects/${projectId}`, { cookie: installer })).body.notes };
    // 'null' is what a sandboxed frame or a privacy-sensitive redirect sends (RFC 6454 section 7).
    for (const origin of ['https://evil.example', 'null', 'http://127.0.0.1.evil.example', 'garbage']) {
      const writes: [string, string, unknown, string][] = [
        ['POST', `/api/projects/${projectId}/plans`, { plan: longExhaustFailPlan }, installer],
        ['PATCH', `/api/projects/${projectId}`, { notes: 'cross-site' }, installer],
        ['DELETE', `/api/attachments/${attachments[0].id}`, undefined, installer],
        ['DELETE', `/api/tokens/${token.body.id}`, undefined, tokenOwner],
        ['POST', '/api/tokens', { name: 'cross-site' }, tokenOwner],
        ['POST', `/api/inspections/${reportId}/review`, { outcome: 'approved' }, inspector],
        ['PATCH', '/api/jurisdictions/demo-county', { amendmentNotes: 'cross-site' }, admin],
        ['PUT', '/api/rule-sets/00000000-0000-4000-8000-000000000000/rules/x', { revision: 1, rule: {} }, admin],
      ];
      for (const [method, path, body, cookie] of writes) {
        const headers: Record<string, string> = body === undefined ? { origin } : { origin, 'content-type': 'application/json' };
        const res = await api(path, { method, cookie, headers, body: body === undefined ? undefined : JSON.stringify(body) });
        expect(res.status, `${origin} ${method} ${path}: ${JSON.stringify(res.body)}`).toBe(403);
        expect(res.body.error).toMatch(/another site/);
      }
    }
    expect(await revisions()).toBe(before.revisions);
    expect((await api(`/api/projects/${projectId}`, { cookie: installer })).body.notes).toBe(before.notes);
    expect((await api(`/api/attachments/${attachments[0].id}`, { cookie: installer })).status).toBe(200);
    expect((await api('/api/me', { token: token.body.token })).status).toBe(200);
  });

  it('accept the same write from our own origin', async () => {
    const own = new URL(process.env.NEXTAUTH_URL ?? baseUrl).origin;
    const res = await api(`/api/projects/${projectId}`, postJson({ notes: SQL_NOTES }, { method: 'PATCH', cookie: installer, headers: { origin: own } }));
    expect(res.status).toBe(200);
  });
});

describe('throttling', () => {
  it('allows ten new API tokens an hour per user and refuses the eleventh, storing nothing for it', { timeout: 60_000 }, async () => {
    const email = await freshUser('token-throttle', 'token-throttle-pw');
    const cookie = await signIn(email, 'token-throttle-pw');
    for (let i = 1; i <= 10; i++) expect((await api('/api/tokens', postJson({ name: `t${i}` }, { cookie }))).status, `token ${i}`).toBe(201);
    const eleventh = await api('/api/tokens', postJson({ name: 't11' }, { cookie }));
    expect(eleventh.status).toBe(429); // RFC 6585 §4 Too Many Requests
    // Until the oldest of the ten is an hour old.
    expect(Number(eleventh.headers.get('retry-after'))).toBeGreaterThan(3500);
    expect(Number(eleventh.headers.get('retry-after'))).toBeLessThanOrEqual(3600);
    expect(eleventh.body.error).toMatch(/10 tokens in the last hour/);
    const user = await db.selectFrom('users').select('id').where('email', '=', email).executeTakeFirstOrThrow();
    const stored = await db.selectFrom('api_tokens').select(db.fn.countAll<number>().as('n')).where('user_id', '=', user.id).executeTakeFirstOrThrow();
    expect(Number(stored.n)).toBe(10);
  });

  it('locks sign-in for an e-mail however its case and spacing are varied', { timeout: 60_000 }, async () => {
    const email = await freshUser('signin-variants', 'right-password-2');
    const variants = [email.toUpperCase(), ` ${email}`, `${email} `, email.replace(/^./, (c) => c.toUpperCase()), email];
    const address = testAddress();
    const attempt = async (who: string, password: string) => (await attemptSignIn(who, password, { address })).error;
    for (const v of variants) expect(await attempt(v, 'wrong-password')).toBe('CredentialsSignin');
    expect(await attempt(email.toUpperCase(), 'right-password-2')).toBe('throttled');
  });
});
