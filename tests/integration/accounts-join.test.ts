import { randomBytes } from 'node:crypto';
import bcrypt from 'bcryptjs';
import { afterAll, describe, expect, it } from 'vitest';
import { PASSWORD_IS_EMAIL, PASSWORD_TOO_SHORT } from '@/lib/domain/accounts/password-policy';
import { hashOneTimeToken } from '@/lib/platform/auth/one-time-token';
import { RESET_REQUESTED_BODY } from '@/lib/services/accounts/passwords';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import { api, appDb, attemptSignIn, baseUrl, postJson, signIn, testAddress } from './helpers';

/*
 * Companies that serve themselves: sign-up (signed in at once, welcome e-mail, reports to inspectors only
 * after the address is confirmed), password reset and change (sessions end, API tokens only when asked),
 * company settings, audit rows and the per-e-mail / per-address limits. Each test uses its own addresses.
 */

const db = appDb();
const inbox = process.env.NOOKPASS_INBOX_URL ?? 'http://127.0.0.1:54326';
afterAll(async () => {
  await db.destroy();
});

const tag = () => randomBytes(5).toString('hex');
const from = (address: string) => ({ 'x-forwarded-for': address });

type Mail = { id: string; to: string; subject: string; text: string };

/** The newest message to `to` whose text holds a link under `path`, waiting briefly (the reset mail leaves after the answer). */
async function linkIn(to: string, path: string, after = 0): Promise<string> {
  for (let i = 0; i < 120; i++) {
    const messages = (await (await fetch(`${inbox}/api/messages`)).json()) as Mail[];
    // Oldest first by the inbox's ids (arrival order), whatever order the inbox lists them in.
    const mine = messages.filter((m) => m.to.toLowerCase() === to.toLowerCase() && m.text.includes(path)).sort((a, b) => a.id.localeCompare(b.id));
    if (mine.length > after) {
      const m = new RegExp(`${path}([A-Za-z0-9_-]+)`).exec(mine.at(-1)!.text);
      if (m) return m[1];
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`no mail to ${to} with ${path}`);
}

async function mailCount(to: string, path: string): Promise<number> {
  const messages = (await (await fetch(`${inbox}/api/messages`)).json()) as Mail[];
  return messages.filter((m) => m.to.toLowerCase() === to.toLowerCase() && m.text.includes(path)).length;
}

function cookieOf(headers: Headers): string {
  const c = headers.getSetCookie().find((x) => x.startsWith('next-auth.session-token='));
  if (!c) throw new Error('no session cookie');
  return c.split(';')[0];
}

async function signUp(over: Partial<{ company: string; name: string; email: string; password: string }> = {}, address = testAddress()) {
  const t = tag();
  const body = { company: `Join Co ${t} (test)`, name: `Join Person ${t}`, email: `join-${t}@example.test`, password: 'a join test password', ...over };
  const res = await api('/api/sign-up', postJson(body, { headers: from(address) }));
  return { ...res, input: body, cookie: res.status === 201 ? cookieOf(res.headers) : '' };
}

async function auditActions(userId: string): Promise<{ action: string; organization_id: string | null }[]> {
  return db.selectFrom('audit_log').select(['action', 'organization_id']).where('entity_id', '=', userId).orderBy('id').execute();
}

async function newCheck(cookie: string): Promise<string> {
  const p = await api('/api/projects', postJson({ name: `Join closet ${tag()} (test)`, siteAddress: '5 Join Road', jurisdiction: 'demo-county' }, { cookie }));
  expect(p.status, JSON.stringify(p.body)).toBe(201);
  expect((await api(`/api/projects/${p.body.id}/plans`, postJson({ plan: hallClosetPassPlan }, { cookie }))).status).toBe(201);
  return (await api(`/api/projects/${p.body.id}/checks`, postJson({}, { cookie }))).body.id;
}

/** A plain installer account made directly (password known), with its own company. */
async function newPerson(password = 'a person password 1') {
  const t = tag();
  const org = await db.insertInto('organizations').values({ name: `Join person co ${t} (test)` }).returning('id').executeTakeFirstOrThrow();
  const email = `join-person-${t}@example.test`;
  const user = await db
    .insertInto('users')
    .values({ email, name: `Person ${t}`, role: 'installer', organization_id: org.id, password_hash: await bcrypt.hash(password, 4), updated_at: new Date() })
    .returning('id')
    .executeTakeFirstOrThrow();
  return { email, password, userId: user.id, organizationId: org.id };
}

describe('company sign-up', () => {
  it('creates the company and its owner, signs them in, audits it and sends the welcome e-mail', { timeout: 60_000 }, async () => {
    const res = await signUp();
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.user).toMatchObject({ email: res.input.email, role: 'installer', isOwner: true });
    const me = await api('/api/me', { cookie: res.cookie });
    expect(me.status).toBe(200);
    expect(me.body.user).toMatchObject({ email: res.input.email, isOwner: true, organizationId: res.body.organization.id });
    const org = await db.selectFrom('organizations').select(['name']).where('id', '=', res.body.organization.id).executeTakeFirstOrThrow();
    expect(org.name).toBe(res.input.company);
    const row = await db.selectFrom('users').select(['is_owner', 'email_confirmed_at']).where('id', '=', res.body.user.id).executeTakeFirstOrThrow();
    expect(row).toEqual({ is_owner: true, email_confirmed_at: null });
    expect(await auditActions(res.body.user.id)).toContainEqual({ action: 'account.sign-up', organization_id: res.body.organization.id });
    // The link in the welcome e-mail names a token stored only as its SHA-256.
    const token = await linkIn(res.input.email, '/confirm-email/');
    const stored = await db.selectFrom('email_confirmations').select(['token_hash']).where('user_id', '=', res.body.user.id).execute();
    expect(stored.map((s) => s.token_hash)).toEqual([hashOneTimeToken(token)]);
    expect(JSON.stringify(stored)).not.toContain(token);
    // Everything else works at once: projects and checks.
    expect(await newCheck(res.cookie)).toMatch(/^[0-9a-f-]{36}$/);
  });

  it('refuses weak passwords beside the field, and taken e-mails and company names, creating nothing', async () => {
    const t = tag();
    const email = `join-weak-${t}@example.test`;
    const short = await signUp({ email, password: 'eleven char' });
    expect(short.status).toBe(400);
    expect(short.body.errors).toEqual([{ path: 'password', message: PASSWORD_TOO_SHORT }]); // OWASP ASVS 4.0.3 V2.1.1: 12 characters
    const same = await signUp({ email, password: email.toUpperCase() });
    expect(same.status).toBe(400);
    expect(same.body.errors).toEqual([{ path: 'password', message: PASSWORD_IS_EMAIL }]);
    const missing = await api('/api/sign-up', postJson({ company: 'x', email: 'not-an-address' }, { headers: from(testAddress()) }));
    expect(missing.status).toBe(400);
    expect(missing.body.errors.map((e: { path: string }) => e.path).sort()).toEqual(['company', 'email', 'name', 'password']);
    expect(await db.selectFrom('users').select('id').where('email', '=', email).executeTakeFirst()).toBeUndefined();

    const first = await signUp();
    expect(first.status).toBe(201);
    const takenEmail = await signUp({ email: first.input.email.toUpperCase(), company: `Other ${t} (test)` });
    expect(takenEmail.status).toBe(400);
    expect(takenEmail.body.errors[0]).toMatchObject({ path: 'email', message: expect.stringContaining('already has a NookPass account') });
    const takenCompany = await signUp({ company: first.input.company.toLowerCase() });
    expect(takenCompany.status).toBe(400);
    expect(takenCompany.body.errors[0]).toMatchObject({ path: 'company' });
    expect(await db.selectFrom('organizations').select('id').where('name', '=', `Other ${t} (test)`).executeTakeFirst()).toBeUndefined();
  });

  it('leaves nothing half-created when two sign-ups race for one e-mail', async () => {
    const email = `join-race-${tag()}@example.test`;
    const companies = [`Race A ${tag()} (test)`, `Race B ${tag()} (test)`];
    const results = await Promise.all(companies.map((company) => signUp({ email, company })));
    expect(results.map((r) => r.status).sort()).toEqual([201, 400]);
    const orgs = await db.selectFrom('organizations').select('name').where('name', 'in', companies).execute();
    // The loser's company was rolled back with its person.
    expect(orgs.length).toBe(1);
    expect(orgs[0].name).toBe(results.find((r) => r.status === 201)!.input.company);
    expect((await db.selectFrom('users').select('id').where('email', '=', email).execute()).length).toBe(1);
  });
});

describe('confirming the e-mail address', () => {
  it('refuses sending to inspectors until confirmed, resends, spends links once and says which are used or expired', { timeout: 90_000 }, async () => {
    const s = await signUp();
    expect(s.status).toBe(201);
    const checkId = await newCheck(s.cookie);
    const refused = await api(`/api/checks/${checkId}/send`, postJson({}, { cookie: s.cookie }));
    expect(refused.status).toBe(403);
    expect(refused.body.error).toContain('Confirm your e-mail address');
    expect(await db.selectFrom('reports').select('id').where('check_id', '=', checkId).execute()).toEqual([]);
    // The report page shows the notice with "Resend confirmation" instead of the send form.
    const html = await (await fetch(`${baseUrl}/projects/${(await api(`/api/checks/${checkId}`, { cookie: s.cookie })).body.projectId}/checks/${checkId}`, { headers: { cookie: s.cookie } })).text();
    expect(html).toContain('unconfirmed-notice');
    expect(html).toContain('Resend confirmation');

    const firstToken = await linkIn(s.input.email, '/confirm-email/');
    const resent = await api('/api/email-confirmations', { method: 'POST', cookie: s.cookie, headers: from(testAddress()) });
    expect(resent.status).toBe(202);
    const secondToken = await linkIn(s.input.email, '/confirm-email/', 1);
    expect(secondToken).not.toBe(firstToken);
    // A newer link replaces the older one.
    expect((await api(`/api/email-confirmations/${firstToken}`, { method: 'POST' })).status).toBe(409);

    const page = await (await fetch(`${baseUrl}/confirm-email/${secondToken}`)).text();
    expect(page).toContain('Confirm my e-mail address');
    const confirmed = await api(`/api/email-confirmations/${secondToken}`, { method: 'POST' });
    expect(confirmed.status).toBe(200);
    const again = await api(`/api/email-confirmations/${secondToken}`, { method: 'POST' });
    expect(again.status).toBe(409);
    expect(again.body.error).toContain('already used');
    expect(await (await fetch(`${baseUrl}/confirm-email/${secondToken}`)).text()).toContain('This link was already used');
    expect(await auditActions(s.body.user.id)).toContainEqual({ action: 'account.email-confirmed', organization_id: s.body.organization.id });
    expect((await api('/api/email-confirmations', { method: 'POST', cookie: s.cookie, headers: from(testAddress()) })).status).toBe(409);

    const sent = await api(`/api/checks/${checkId}/send`, postJson({}, { cookie: s.cookie }));
    expect(sent.status, JSON.stringify(sent.body)).toBe(201);
  });

  it('refuses an expired or unknown confirmation link with what to do next', async () => {
    const s = await signUp();
    const token = await linkIn(s.input.email, '/confirm-email/');
    await db.updateTable('email_confirmations').set({ expires_at: new Date(Date.now() - 1000) }).where('token_hash', '=', hashOneTimeToken(token)).execute();
    const expired = await api(`/api/email-confirmations/${token}`, { method: 'POST' });
    expect(expired.status).toBe(409);
    expect(expired.body.error).toContain('expired');
    expect(await (await fetch(`${baseUrl}/confirm-email/${token}`)).text()).toContain('This link has expired');
    expect((await api(`/api/email-confirmations/${'B'.repeat(43)}`, { method: 'POST' })).status).toBe(404);
    expect((await api('/api/email-confirmations/..%2F..%2Fetc', { method: 'POST' })).status).toBe(404);
    expect((await db.selectFrom('users').select('email_confirmed_at').where('id', '=', s.body.user.id).executeTakeFirstOrThrow()).email_confirmed_at).toBeNull();
  });
});

describe('password reset', () => {
  it('answers 202 with the same body for known and unknown addresses, in similar time', { timeout: 90_000 }, async () => {
    const known = await Promise.all(Array.from({ length: 6 }, () => newPerson()));
    const unknown = Array.from({ length: 6 }, () => `join-nobody-${tag()}@example.test`);
    const timed = async (email: string) => {
      const started = performance.now();
      const res = await api('/api/password-resets', postJson({ email }, { headers: from(testAddress()) }));
      return { ...res, ms: performance.now() - started };
    };
    // Warm both paths once, then alternate so neither gets the quieter moments.
    await timed(`join-warm-${tag()}@example.test`);
    const k: number[] = [];
    const u: number[] = [];
    for (let i = 0; i < 6; i++) {
      const a = await timed(known[i].email);
      const b = await timed(unknown[i]);
      expect([a.status, b.status]).toEqual([202, 202]);
      expect(a.body).toEqual(RESET_REQUESTED_BODY);
      expect(b.body).toEqual(a.body);
      expect([...a.headers.keys()].filter((h) => h !== 'date').sort()).toEqual([...b.headers.keys()].filter((h) => h !== 'date').sort());
      k.push(a.ms);
      u.push(b.ms);
    }
    const median = (xs: number[]) => [...xs].sort((x, y) => x - y)[Math.floor(xs.length / 2)];
    // Within 100 ms of each other: common practice, no published source. The mail leaves after the answer.
    expect(Math.abs(median(k) - median(u))).toBeLessThan(100);
    for (const person of known) await linkIn(person.email, '/reset-password/');
  });

  it('sets a new password once: every session ends, API tokens go unless kept, the link cannot be used again', { timeout: 90_000 }, async () => {
    const person = await newPerson();
    const session = await signIn(person.email, person.password, { address: testAddress() });
    const token = (await api('/api/tokens', postJson({ name: 'join reset test' }, { cookie: session }))).body.token as string;
    expect((await api('/api/me', { token })).status).toBe(200);

    expect((await api('/api/password-resets', postJson({ email: person.email }, { headers: from(testAddress()) }))).status).toBe(202);
    const link = await linkIn(person.email, '/reset-password/');
    const row = await db.selectFrom('password_resets').select(['created_at', 'expires_at']).where('token_hash', '=', hashOneTimeToken(link)).executeTakeFirstOrThrow();
    expect((row.expires_at.getTime() - row.created_at.getTime()) / 1000).toBeCloseTo(3600, -1); // one hour, OWASP Forgot Password Cheat Sheet leaves the length to us
    expect(await (await fetch(`${baseUrl}/reset-password/${link}`)).text()).toContain('Set new password');

    const weak = await api(`/api/password-resets/${link}`, postJson({ password: person.email }));
    expect(weak.status).toBe(400);
    expect(weak.body.errors).toEqual([{ path: 'password', message: PASSWORD_IS_EMAIL }]);
    const done = await api(`/api/password-resets/${link}`, postJson({ password: 'the brand new password' }));
    expect(done.status).toBe(204);

    expect((await api('/api/me', { cookie: session })).status).toBe(401);
    expect((await api('/api/me', { token })).status).toBe(401);
    const reused = await api(`/api/password-resets/${link}`, postJson({ password: 'yet another new password' }));
    expect(reused.status).toBe(409);
    expect(reused.body.error).toContain('already used');
    expect(await (await fetch(`${baseUrl}/reset-password/${link}`)).text()).toContain('This link was already used');
    expect((await attemptSignIn(person.email, person.password, { address: testAddress() })).cookie).toBeNull();
    expect((await attemptSignIn(person.email, 'the brand new password', { address: testAddress() })).cookie).not.toBeNull();
    const actions = (await auditActions(person.userId)).map((a) => a.action);
    expect(actions).toEqual(expect.arrayContaining(['account.password-reset-requested', 'account.password-reset', 'auth.sign-in', 'auth.sign-in-failed']));
    expect((await auditActions(person.userId)).every((a) => a.organization_id === person.organizationId)).toBe(true);
  });

  it('keeps API tokens when asked, and refuses expired and unknown links saying which', { timeout: 60_000 }, async () => {
    const person = await newPerson();
    const session = await signIn(person.email, person.password, { address: testAddress() });
    const token = (await api('/api/tokens', postJson({ name: 'join keep test' }, { cookie: session }))).body.token as string;
    await api('/api/password-resets', postJson({ email: person.email }, { headers: from(testAddress()) }));
    const link = await linkIn(person.email, '/reset-password/');
    expect((await api(`/api/password-resets/${link}`, postJson({ password: 'kept tokens password', keepApiTokens: true }))).status).toBe(204);
    expect((await api('/api/me', { token })).status).toBe(200);
    expect((await api('/api/me', { cookie: session })).status).toBe(401);

    await api('/api/password-resets', postJson({ email: person.email }, { headers: from(testAddress()) }));
    const late = await linkIn(person.email, '/reset-password/', 1);
    await db.updateTable('password_resets').set({ expires_at: new Date(Date.now() - 1000) }).where('token_hash', '=', hashOneTimeToken(late)).execute();
    const expired = await api(`/api/password-resets/${late}`, postJson({ password: 'too late password' }));
    expect(expired.status).toBe(409);
    expect(expired.body.error).toContain('expired');
    expect(await (await fetch(`${baseUrl}/reset-password/${late}`)).text()).toContain('This link has expired');
    const unknown = await api(`/api/password-resets/${'C'.repeat(43)}`, postJson({ password: 'unknown link password' }));
    expect(unknown.status).toBe(404);
    expect(await (await fetch(`${baseUrl}/reset-password/not-a-token`)).text()).toContain('This link is not valid');
    expect((await attemptSignIn(person.email, 'kept tokens password', { address: testAddress() })).cookie).not.toBeNull();
  });
});

describe('changing the password on the Account page', () => {
  it('checks the current one, ends the other sessions and keeps this one, and refuses API tokens', { timeout: 60_000 }, async () => {
    const person = await newPerson();
    const here = await signIn(person.email, person.password, { address: testAddress() });
    const elsewhere = await signIn(person.email, person.password, { address: testAddress() });
    const token = (await api('/api/tokens', postJson({ name: 'join change test' }, { cookie: here }))).body.token as string;

    const wrong = await api('/api/account/password', postJson({ currentPassword: 'not it at all', password: 'changed password 1' }, { cookie: here }));
    expect(wrong.status).toBe(400);
    expect(wrong.body.errors).toEqual([{ path: 'currentPassword', message: 'That is not your current password.' }]);
    const short = await api('/api/account/password', postJson({ currentPassword: person.password, password: 'short' }, { cookie: here }));
    expect(short.body.errors).toEqual([{ path: 'password', message: PASSWORD_TOO_SHORT }]);
    const viaToken = await api('/api/account/password', postJson({ currentPassword: person.password, password: 'changed password 1' }, { token }));
    expect(viaToken.status).toBe(403);

    const changed = await api('/api/account/password', postJson({ currentPassword: person.password, password: 'changed password 1' }, { cookie: here }));
    expect(changed.status).toBe(200);
    expect(changed.body).toEqual({ sessionsEnded: 1, tokensRevoked: 1 });
    expect((await api('/api/me', { cookie: here })).status).toBe(200);
    expect((await api('/api/me', { cookie: elsewhere })).status).toBe(401);
    expect((await api('/api/me', { token })).status).toBe(401);
    expect((await auditActions(person.userId)).map((a) => a.action)).toContain('account.password-changed');
  });
});

describe('company settings', () => {
  it('lets the owner keep the details that reports print and new projects start from', { timeout: 90_000 }, async () => {
    const s = await signUp();
    const bad = await api('/api/organization', postJson({ name: s.input.company, phone: 'call me maybe', defaultJurisdiction: 'nowhere-at-all' }, { method: 'PATCH', cookie: s.cookie }));
    expect(bad.status).toBe(400);
    expect(bad.body.errors.map((e: { path: string }) => e.path)).toEqual(['phone']);
    const unknownJur = await api('/api/organization', postJson({ name: s.input.company, defaultJurisdiction: 'nowhere-at-all' }, { method: 'PATCH', cookie: s.cookie }));
    expect(unknownJur.body.errors).toEqual([{ path: 'defaultJurisdiction', message: expect.any(String) }]);
    const license = `LIC-${tag().toUpperCase()}`;
    const saved = await api('/api/organization', postJson({ name: s.input.company, address: '9 Settings St', phone: '+1 555-0100 ext. 4', licenseNumber: license, defaultJurisdiction: 'demo-county' }, { method: 'PATCH', cookie: s.cookie }));
    expect(saved.status, JSON.stringify(saved.body)).toBe(200);
    expect(saved.body).toMatchObject({ address: '9 Settings St', licenseNumber: license, defaultJurisdiction: { slug: 'demo-county' } });
    expect(await auditActions(s.body.organization.id)).toContainEqual({ action: 'organization.update', organization_id: s.body.organization.id });

    // The licence is on the issued report: the PDF's text and the web verification page.
    const checkId = await newCheck(s.cookie);
    const pdf = await fetch(`${baseUrl}/api/checks/${checkId}/report`, { method: 'POST', headers: { cookie: s.cookie } });
    expect(pdf.status).toBe(200);
    const code = (await db.selectFrom('reports').select('code').where('check_id', '=', checkId).executeTakeFirstOrThrow()).code;
    const verify = await (await fetch(`${baseUrl}/verify/${code}`, { headers: from(testAddress()) })).text();
    expect(verify).toContain(license);
    expect(verify).toContain(s.input.company);

    // Another company's installer who is not an owner cannot change it; nor can inspectors.
    const other = await signIn('other-installer@nookpass.demo', undefined, { address: testAddress() });
    expect((await api('/api/organization', postJson({ name: 'Hijack (test)' }, { method: 'PATCH', cookie: other }))).status).toBe(403);
  });
});

describe('limits', () => {
  it('throttles sign-ups per e-mail and per client address with 429 and Retry-After', { timeout: 60_000 }, async () => {
    const email = `join-limit-${tag()}@example.test`;
    const perEmail = [];
    for (let i = 0; i < 4; i++) perEmail.push(await signUp({ email }, testAddress()));
    expect(perEmail.map((r) => r.status)).toEqual([201, 400, 400, 429]); // 3 an hour per e-mail: common practice, no published source
    expect(Number(perEmail[3].headers.get('retry-after'))).toBeGreaterThan(0);
    const address = testAddress();
    const perAddress = [];
    for (let i = 0; i < 11; i++) perAddress.push((await signUp({}, address)).status);
    expect(perAddress).toEqual([...Array(10).fill(201), 429]); // 10 an hour per address: common practice, no published source
  });

  it('throttles reset requests the same for known and unknown addresses', { timeout: 60_000 }, async () => {
    const person = await newPerson();
    const unknown = `join-nobody-${tag()}@example.test`;
    for (const email of [person.email, unknown]) {
      const statuses = [];
      for (let i = 0; i < 4; i++) {
        const r = await api('/api/password-resets', postJson({ email }, { headers: from(testAddress()) }));
        statuses.push(r.status);
        if (r.status === 429) expect(Number(r.headers.get('retry-after'))).toBeGreaterThan(0);
      }
      expect(statuses).toEqual([202, 202, 202, 429]);
    }
    const address = testAddress();
    const fromOne = [];
    for (let i = 0; i < 11; i++) fromOne.push((await api('/api/password-resets', postJson({ email: `join-sweep-${tag()}@example.test` }, { headers: from(address) }))).status);
    expect(fromOne).toEqual([...Array(10).fill(202), 429]);
    // Three requests for the person's e-mail made three links, no more.
    expect(await mailCount(person.email, '/reset-password/')).toBeLessThanOrEqual(3);
  });

  it('throttles confirmation e-mails per e-mail address', { timeout: 60_000 }, async () => {
    const s = await signUp();
    const statuses = [];
    for (let i = 0; i < 4; i++) statuses.push((await api('/api/email-confirmations', { method: 'POST', cookie: s.cookie, headers: from(testAddress()) })).status);
    expect(statuses).toEqual([202, 202, 202, 429]);
  });
});
