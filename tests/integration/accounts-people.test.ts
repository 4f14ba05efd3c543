import { randomBytes } from 'node:crypto';
import bcrypt from 'bcryptjs';
import { sql } from 'kysely';
import { afterAll, describe, expect, it } from 'vitest';
import { api, appDb, attemptSignIn, baseUrl, deactivateTestPeople, postJson, signIn, testAddress } from './helpers';

const db = appDb();
afterAll(async () => {
  await db.destroy();
});

const inbox = process.env.NOOKPASS_INBOX_URL ?? 'http://127.0.0.1:54326';
const PASSWORD = 'people-test-password-1';
const rand = () => randomBytes(4).toString('hex');
const fresh = (what: string) => `${what}-${rand()}@example.test`;

/** The invitation link mailed to `email`: the fake relay's inbox, polled while the outbox delivers it (up to 20 s). */
async function invitationToken(email: string): Promise<string> {
  for (let i = 0; i < 200; i++) {
    const messages = (await (await fetch(`${inbox}/api/messages`)).json()) as Array<{ to: string; text: string }>;
    const mine = messages.find((m) => m.to.toLowerCase().includes(email));
    const m = mine?.text.match(/\/invitations\/([A-Za-z0-9_-]{43})/);
    if (m) return m[1];
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`no invitation mailed to ${email}`);
}

function invite(body: unknown, cookie: string, address = testAddress()) {
  return api('/api/invitations', postJson(body, { cookie, headers: { 'x-forwarded-for': address } }));
}

function accept(token: string, body: unknown, address = testAddress()) {
  return api(`/api/invitations/${token}/accept`, postJson(body, { headers: { 'x-forwarded-for': address } }));
}

function patchPerson(id: string, body: unknown, cookie: string) {
  return api(`/api/users/${id}`, postJson(body, { cookie, method: 'PATCH' }));
}

const setCookieOf = (headers: Headers) => headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');

/** A company of its own with one owner, so last-owner tests never touch the demo companies. */
async function freshCompany(): Promise<{ orgId: string; ownerId: string; ownerEmail: string; owner: string }> {
  const org = await db.insertInto('organizations').values({ name: `People test company ${rand()} (test)`, license_number: null }).returning('id').executeTakeFirstOrThrow();
  const ownerEmail = fresh('people-owner');
  const row = await db
    .insertInto('users')
    .values({ email: ownerEmail, name: 'People Test Owner', role: 'installer', is_owner: true, organization_id: org.id, password_hash: bcrypt.hashSync(PASSWORD, 4) })
    .returning('id')
    .executeTakeFirstOrThrow();
  return { orgId: org.id, ownerId: row.id, ownerEmail, owner: await signIn(ownerEmail, PASSWORD, { address: testAddress() }) };
}

async function freshMember(orgId: string, opts: { owner?: boolean } = {}): Promise<{ id: string; email: string; cookie: string }> {
  const email = fresh('people-member');
  const row = await db
    .insertInto('users')
    .values({ email, name: 'People Test Member', role: 'installer', is_owner: !!opts.owner, organization_id: orgId, password_hash: bcrypt.hashSync(PASSWORD, 4) })
    .returning('id')
    .executeTakeFirstOrThrow();
  return { id: row.id, email, cookie: await signIn(email, PASSWORD, { address: testAddress() }) };
}

describe('an owner invites a teammate', () => {
  it('mails a single-use link; accepting creates the account, signs in and shows only the company’s projects', { timeout: 60_000 }, async () => {
    const owner = await signIn('installer@nookpass.demo', undefined, { address: testAddress() });
    const email = fresh('teammate');
    const sent = await invite({ email: email.toUpperCase(), role: 'installer' }, owner);
    expect(sent.status, JSON.stringify(sent.body)).toBe(201);
    expect(sent.body).toMatchObject({ email, role: 'installer', state: 'pending', organizationName: 'Demo Closet Works' });
    // Seven days, by the database's clock: well within a minute of now + 7 d.
    expect(Math.abs(Date.parse(sent.body.expiresAt) - Date.now() - 7 * 24 * 3600_000)).toBeLessThan(60_000);

    const pending = await api('/api/invitations', { cookie: owner });
    expect(pending.body.invitations.map((i: { email: string }) => i.email)).toContain(email);

    const token = await invitationToken(email);
    // ≥ 128 random bits: 43 base64url characters carry 256 (RFC 4648 section 5).
    expect(token).toHaveLength(43);
    const stored = await db.selectFrom('invitations').select('token_hash').where('id', '=', sent.body.id).executeTakeFirstOrThrow();
    expect(stored.token_hash).not.toContain(token);
    expect(stored.token_hash).toMatch(/^[0-9a-f]{64}$/);

    const short = await accept(token, { name: 'New Teammate', password: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.errors[0].path).toBe('password');
    const same = await accept(token, { name: 'New Teammate', password: email });
    expect(same.status).toBe(400);
    expect(same.body.errors[0].path).toBe('password');
    const noName = await accept(token, { password: PASSWORD });
    expect(noName.body.errors[0].path).toBe('name');

    const accepted = await accept(token, { name: 'New Teammate', password: PASSWORD });
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(201);
    const cookie = setCookieOf(accepted.headers);
    expect(cookie).toContain('next-auth.session-token=');
    const me = await api('/api/me', { cookie });
    expect(me.body.user).toMatchObject({ email, role: 'installer', isOwner: false });

    const projects = await api('/api/projects', { cookie });
    expect(projects.status).toBe(200);
    const names: string[] = projects.body.items.map((p: { name: string }) => p.name);
    expect(names).toContain('Demo — hall closet pair, 12 Example Lane');
    expect(names).not.toContain('Demo — second company hall closet, 300 Fictional Ave');

    const row = await db.selectFrom('invitations').select(['accepted_at', 'accepted_user_id']).where('id', '=', sent.body.id).executeTakeFirstOrThrow();
    expect(row.accepted_at).not.toBeNull();
    const user = await db.selectFrom('users').select(['id', 'is_owner', 'email_confirmed_at']).where('email', '=', email).executeTakeFirstOrThrow();
    expect(row.accepted_user_id).toBe(user.id);
    expect(user.is_owner).toBe(false);
    expect(user.email_confirmed_at).not.toBeNull();

    const members = await api('/api/organization/members', { cookie: owner });
    expect(members.body.members.map((m: { email: string }) => m.email)).toContain(email);

    // Single use: the same link again is refused and says why; no second account.
    const again = await accept(token, { name: 'Someone Else', password: 'another-password-2' });
    expect(again.status).toBe(409);
    expect(again.body.error).toMatch(/already been used/);
    const page = await (await fetch(`${baseUrl}/invitations/${token}`)).text();
    expect(page).toContain('already been used');
  });

  it('refuses an address that already has an account, naming the field', async () => {
    const owner = await signIn('installer@nookpass.demo', undefined, { address: testAddress() });
    const res = await invite({ email: 'inspector@nookpass.demo', role: 'installer' }, owner);
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual([{ path: 'email', message: expect.stringMatching(/already has a NookPass account/) }]);
  });

  it('lets owners invite only into their company, and plain installers not at all', async () => {
    const owner = await signIn('installer@nookpass.demo', undefined, { address: testAddress() });
    const inspector = await invite({ email: fresh('nope'), role: 'inspector', jurisdiction: 'demo-county' }, owner);
    expect(inspector.status).toBe(400);
    expect(inspector.body.errors[0].path).toBe('role');
    const plain = await signIn('installer2@nookpass.demo', undefined, { address: testAddress() });
    expect((await invite({ email: fresh('nope'), role: 'installer' }, plain)).status).toBe(403);
    const bad = await invite({ email: 'not an address', role: 'boss' }, owner);
    expect(bad.status).toBe(400);
    expect(bad.body.errors.map((e: { path: string }) => e.path).sort()).toEqual(['email', 'role']);
  });

  it('an owner invitation makes an owner', { timeout: 90_000 }, async () => {
    const { owner, orgId } = await freshCompany();
    const email = fresh('co-owner');
    expect((await invite({ email, role: 'owner' }, owner)).status).toBe(201);
    const res = await accept(await invitationToken(email), { name: 'Co Owner', password: PASSWORD });
    expect(res.status).toBe(201);
    const row = await db.selectFrom('users').select(['is_owner', 'organization_id']).where('email', '=', email).executeTakeFirstOrThrow();
    expect(row).toEqual({ is_owner: true, organization_id: orgId });
  });
});

describe('an admin invites an inspector', () => {
  it('for Demo County: the inspector accepts and sees that jurisdiction’s inspections', { timeout: 60_000 }, async () => {
    const admin = await signIn('admin@nookpass.demo', undefined, { address: testAddress() });
    const email = fresh('inspector');
    const missing = await invite({ email, role: 'inspector' }, admin);
    expect(missing.status).toBe(400);
    expect(missing.body.errors[0].path).toBe('jurisdiction');
    const unknown = await invite({ email, role: 'inspector', jurisdiction: 'no-such-place' }, admin);
    expect(unknown.body.errors[0].path).toBe('jurisdiction');
    const installer = await invite({ email, role: 'installer' }, admin);
    expect(installer.body.errors[0].path).toBe('role');

    const sent = await invite({ email, role: 'inspector', jurisdiction: 'demo-county' }, admin);
    expect(sent.status, JSON.stringify(sent.body)).toBe(201);
    expect(sent.body.jurisdictionName).toBe('Demo County');
    const res = await accept(await invitationToken(email), { name: 'New Inspector', password: PASSWORD });
    expect(res.status).toBe(201);
    const cookie = setCookieOf(res.headers);
    const county = await db.selectFrom('jurisdictions').select('id').where('slug', '=', 'demo-county').executeTakeFirstOrThrow();
    const row = await db.selectFrom('users').select(['role', 'jurisdiction_id', 'organization_id']).where('email', '=', email).executeTakeFirstOrThrow();
    expect(row).toEqual({ role: 'inspector', jurisdiction_id: county.id, organization_id: null });
    const inspections = await api('/api/inspections', { cookie });
    expect(inspections.status).toBe(200);
    expect((await api('/api/projects', { cookie })).status).toBe(403);
  });
});

describe('invitation links that no longer work', () => {
  it('a revoked link is refused and its page says it was withdrawn; revoking twice is a 409; another company gets 404', { timeout: 90_000 }, async () => {
    const owner = await signIn('installer@nookpass.demo', undefined, { address: testAddress() });
    const { owner: other } = await freshCompany();
    const email = fresh('revoked');
    const sent = await invite({ email, role: 'installer' }, owner);
    const token = await invitationToken(email);
    expect((await api(`/api/invitations/${sent.body.id}`, { cookie: other, method: 'DELETE' })).status).toBe(404);
    const revoked = await api(`/api/invitations/${sent.body.id}`, { cookie: owner, method: 'DELETE' });
    expect(revoked.status).toBe(200);
    expect(revoked.body.state).toBe('revoked');
    expect((await api(`/api/invitations/${sent.body.id}`, { cookie: owner, method: 'DELETE' })).status).toBe(409);
    const res = await accept(token, { name: 'Too Late', password: PASSWORD });
    expect(res.status).toBe(409);
    expect(res.body.error).toMatch(/revoked/);
    expect(await (await fetch(`${baseUrl}/invitations/${token}`)).text()).toContain('withdrawn');
    const pending = await api('/api/invitations', { cookie: owner });
    expect(pending.body.invitations.map((i: { id: string }) => i.id)).not.toContain(sent.body.id);
  });

  it('an expired link is refused and its page says it expired; an unknown one is a 404', { timeout: 90_000 }, async () => {
    const owner = await signIn('installer@nookpass.demo', undefined, { address: testAddress() });
    const email = fresh('expired');
    const sent = await invite({ email, role: 'installer' }, owner);
    const token = await invitationToken(email);
    await db.updateTable('invitations').set({ expires_at: sql<Date>`now() - interval '1 second'` }).where('id', '=', sent.body.id).execute();
    const res = await accept(token, { name: 'Too Late', password: PASSWORD });
    expect(res.status).toBe(409);
    expect(res.body.error).toMatch(/expired/);
    expect(await db.selectFrom('users').select('id').where('email', '=', email).executeTakeFirst()).toBeUndefined();
    expect(await (await fetch(`${baseUrl}/invitations/${token}`)).text()).toContain('has expired');
    expect((await accept('A'.repeat(43), { name: 'Nobody', password: PASSWORD })).status).toBe(404);
    expect((await fetch(`${baseUrl}/invitations/not-a-token`)).status).toBe(404);
  });

  it('a new invitation to the same address replaces the pending one', { timeout: 90_000 }, async () => {
    const owner = await signIn('installer@nookpass.demo', undefined, { address: testAddress() });
    const email = fresh('resent');
    const first = await invite({ email, role: 'installer' }, owner);
    const firstToken = await invitationToken(email);
    const second = await invite({ email, role: 'installer' }, owner);
    expect(second.status).toBe(201);
    const row = await db.selectFrom('invitations').select('revoked_at').where('id', '=', first.body.id).executeTakeFirstOrThrow();
    expect(row.revoked_at).not.toBeNull();
    expect((await accept(firstToken, { name: 'Old Link', password: PASSWORD })).status).toBe(409);
  });

  it('accepting one link twice at once creates one account', { timeout: 90_000 }, async () => {
    const owner = await signIn('installer@nookpass.demo', undefined, { address: testAddress() });
    const email = fresh('race');
    await invite({ email, role: 'installer' }, owner);
    const token = await invitationToken(email);
    const answers = await Promise.all([1, 2, 3].map(() => accept(token, { name: 'Racer', password: PASSWORD })));
    expect(answers.map((a) => a.status).sort()).toEqual([201, 409, 409]);
    const n = await db.selectFrom('users').select(sql<number>`count(*)::int`.as('n')).where('email', '=', email).executeTakeFirstOrThrow();
    expect(n.n).toBe(1);
  });
});

describe('people administration', () => {
  it('an owner cannot demote or deactivate the last owner; with a second owner they can', { timeout: 90_000 }, async () => {
    const { owner, ownerId, orgId } = await freshCompany();
    const demote = await patchPerson(ownerId, { role: 'installer' }, owner);
    expect(demote.status).toBe(409);
    expect(demote.body.error).toMatch(/only active owner/);
    const member = await freshMember(orgId);
    const admin = await signIn('admin@nookpass.demo', undefined, { address: testAddress() });
    const deactivate = await patchPerson(ownerId, { active: false }, admin);
    expect(deactivate.status).toBe(409);
    expect(deactivate.body.error).toMatch(/only active owner/);

    const promoted = await patchPerson(member.id, { role: 'owner' }, owner);
    expect(promoted.status).toBe(200);
    expect(promoted.body.person.isOwner).toBe(true);
    expect((await patchPerson(ownerId, { role: 'installer' }, owner)).status).toBe(200);
    // The former owner is now a plain installer: no more people administration.
    expect((await api('/api/organization/members', { cookie: owner })).status).toBe(403);
    const last = await patchPerson(member.id, { role: 'installer' }, member.cookie);
    expect(last.status).toBe(409);
  });

  it('an owner reaches only their own company; jurisdictions are for admins; bad bodies name the field', { timeout: 90_000 }, async () => {
    const { owner, orgId } = await freshCompany();
    const member = await freshMember(orgId);
    const stranger = await db.selectFrom('users').select('id').where('email', '=', 'installer2@nookpass.demo').executeTakeFirstOrThrow();
    expect((await patchPerson(stranger.id, { active: false }, owner)).status).toBe(404);
    expect((await patchPerson(member.id, { jurisdiction: 'demo-county' }, owner)).status).toBe(403);
    const bad = await patchPerson(member.id, { role: 'admin' }, owner);
    expect(bad.status).toBe(400);
    expect(bad.body.errors[0].path).toBe('role');
    const empty = await patchPerson(member.id, {}, owner);
    expect(empty.status).toBe(400);
    const unknownField = await patchPerson(member.id, { email: 'x@example.test' }, owner);
    expect(unknownField.status).toBe(400);
    expect((await patchPerson(member.id, { active: false }, member.cookie)).status).toBe(403);
  });

  it('an admin changes an inspector’s jurisdiction and cannot deactivate themselves', { timeout: 90_000 }, async () => {
    const admin = await signIn('admin@nookpass.demo', undefined, { address: testAddress() });
    const county = await db.selectFrom('jurisdictions').select('id').where('slug', '=', 'demo-county').executeTakeFirstOrThrow();
    const email = fresh('moved-inspector');
    const row = await db.insertInto('users').values({ email, name: 'Moved Inspector', role: 'inspector', jurisdiction_id: county.id, password_hash: bcrypt.hashSync(PASSWORD, 4) }).returning('id').executeTakeFirstOrThrow();
    const moved = await patchPerson(row.id, { jurisdiction: 'demo-city' }, admin);
    expect(moved.status).toBe(200);
    expect(moved.body.person.jurisdictionName).toBe('Demo City');
    const installer = await db.selectFrom('users').select('id').where('email', '=', 'installer2@nookpass.demo').executeTakeFirstOrThrow();
    expect((await patchPerson(installer.id, { jurisdiction: 'demo-city' }, admin)).body.errors[0].path).toBe('jurisdiction');
    const self = await db.selectFrom('users').select('id').where('email', '=', 'admin@nookpass.demo').executeTakeFirstOrThrow();
    expect((await patchPerson(self.id, { active: false }, admin)).status).toBe(409);
    await deactivateTestPeople(db, email);
  });
});

describe('deactivation', () => {
  it('ends the person’s session and API token at their next request, refuses sign-in, keeps their records; reactivation lets them in again', { timeout: 60_000 }, async () => {
    const { owner, orgId } = await freshCompany();
    const member = await freshMember(orgId);
    const created = await api('/api/tokens', postJson({ name: 'deactivation test' }, { cookie: member.cookie }));
    expect(created.status).toBe(201);
    const token = created.body.token as string;
    const project = await api('/api/projects', postJson({ name: 'Deactivation closet (test)', siteAddress: '3 Test Row', jurisdiction: 'demo-county' }, { cookie: member.cookie }));
    expect(project.status).toBe(201);
    expect((await api('/api/me', { token })).status).toBe(200);

    const off = await patchPerson(member.id, { active: false }, owner);
    expect(off.status).toBe(200);
    expect(off.body.person.deactivatedAt).not.toBeNull();

    expect((await api('/api/me', { cookie: member.cookie })).status).toBe(401);
    expect((await api('/api/projects', { cookie: member.cookie })).status).toBe(401);
    expect((await api('/api/me', { token })).status).toBe(401);
    const signInAgain = await attemptSignIn(member.email, PASSWORD, { address: testAddress() });
    expect(signInAgain.cookie).toBeNull();
    expect(signInAgain.error).toBe('deactivated');
    // A wrong password says nothing about the account.
    expect((await attemptSignIn(member.email, 'wrong-password-123', { address: testAddress() })).error).toBe('CredentialsSignin');
    // Their records stay: the project is still the company's.
    expect((await api(`/api/projects/${project.body.id}`, { cookie: owner })).status).toBe(200);

    const on = await patchPerson(member.id, { active: true }, owner);
    expect(on.status).toBe(200);
    expect(on.body.person.deactivatedAt).toBeNull();
    const back = await signIn(member.email, PASSWORD, { address: testAddress() });
    expect((await api('/api/me', { cookie: back })).status).toBe(200);
    // Tokens made before stay revoked: a person who comes back makes new ones.
    expect((await api('/api/me', { token })).status).toBe(401);
  });
});

describe('the audit trail of account events', () => {
  it('admins filter by action, person and dates; owners read only their company’s', { timeout: 60_000 }, async () => {
    const { owner, orgId, ownerEmail } = await freshCompany();
    const member = await freshMember(orgId);
    const email = fresh('audited');
    await invite({ email, role: 'installer' }, owner);
    await patchPerson(member.id, { active: false }, owner);
    await patchPerson(member.id, { active: true }, owner);
    await patchPerson(member.id, { role: 'owner' }, owner);

    const admin = await signIn('admin@nookpass.demo', undefined, { address: testAddress() });
    const sent = await api(`/api/admin/audit?action=invitation.send&person=${encodeURIComponent(email)}`, { cookie: admin });
    expect(sent.status).toBe(200);
    expect(sent.body).toHaveLength(1);
    expect(sent.body[0]).toMatchObject({ action: 'invitation.send', actorEmail: ownerEmail, details: { email, role: 'installer' } });
    const today = new Date().toISOString().slice(0, 10);
    const byPerson = await api(`/api/admin/audit?person=${encodeURIComponent(member.email)}&from=${today}&to=${today}`, { cookie: admin });
    // Their own sign-in is on record too; the changes made to them come newest first.
    expect(byPerson.body.map((r: { action: string }) => r.action).filter((a: string) => a.startsWith('user.'))).toEqual(['user.role-change', 'user.reactivate', 'user.deactivate']);
    expect(byPerson.body.map((r: { action: string }) => r.action)).toContain('auth.sign-in');
    const yesterday = new Date(Date.now() - 24 * 3600_000).toISOString().slice(0, 10);
    expect((await api(`/api/admin/audit?person=${encodeURIComponent(member.email)}&to=${yesterday}`, { cookie: admin })).body).toEqual([]);
    const badDate = await api('/api/admin/audit?from=yesterday', { cookie: admin });
    expect(badDate.status).toBe(400);
    expect(badDate.body.errors[0].path).toBe('from');

    const mine = await api('/api/organization/audit', { cookie: owner });
    expect(mine.status).toBe(200);
    const actions = mine.body.entries.map((r: { action: string }) => r.action);
    expect(actions).toEqual(expect.arrayContaining(['invitation.send', 'user.deactivate', 'user.reactivate', 'user.role-change']));
    const { owner: otherOwner } = await freshCompany();
    const theirs = await api(`/api/organization/audit?person=${encodeURIComponent(member.email)}`, { cookie: otherOwner });
    expect(theirs.body.entries).toEqual([]);
  });
});

describe('invitation limits', () => {
  it('five invitations an hour to one address, then 429 with Retry-After, from anywhere', { timeout: 60_000 }, async () => {
    const { owner } = await freshCompany();
    const email = fresh('flooded');
    for (let i = 0; i < 5; i++) expect((await invite({ email, role: 'installer' }, owner)).status).toBe(201);
    const refused = await invite({ email, role: 'installer' }, owner);
    expect(refused.status).toBe(429); // RFC 6585 section 4
    expect(Number(refused.headers.get('retry-after'))).toBeGreaterThan(0);
    expect(Number(refused.headers.get('retry-after'))).toBeLessThanOrEqual(3600);
  });

  it('thirty invitations an hour from one client address, then 429 with Retry-After', { timeout: 120_000 }, async () => {
    const { owner } = await freshCompany();
    const address = testAddress();
    for (let i = 0; i < 30; i++) expect((await invite({ email: fresh(`burst${i}`), role: 'installer' }, owner, address)).status).toBe(201);
    const refused = await invite({ email: fresh('burst-over'), role: 'installer' }, owner, address);
    expect(refused.status).toBe(429);
    expect(Number(refused.headers.get('retry-after'))).toBeGreaterThan(0);
    // Another address is not held back.
    expect((await invite({ email: fresh('elsewhere'), role: 'installer' }, owner)).status).toBe(201);
  });
});
