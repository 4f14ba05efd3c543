import { randomBytes } from 'node:crypto';
import bcrypt from 'bcryptjs';
import { afterAll, describe, expect, it } from 'vitest';
import { PASSWORD_COST, hashCost } from '@/lib/platform/auth/password';
import { THROTTLED_MESSAGE } from '@/lib/platform/auth/sign-in-messages';
import { api, appDb, attemptSignIn, baseUrl, demoPassword, testAddress } from './helpers';

const db = appDb();
afterAll(async () => {
  await db.destroy();
});

const origin = new URL(baseUrl).origin;

describe('redirects after sign-in and sign-out stay on our origin', () => {
  // WHATWG URL standard: in http(s) URLs a backslash is a slash and tab/newline are dropped, so each of
  // these is another host to a browser.
  const hostile = ['/\\127.0.0.1:8081/pwned', '/\t/127.0.0.1:8081/pwned', '//127.0.0.1:8081/pwned', 'http://127.0.0.1:8081/pwned', '/%5C127.0.0.1:8081/pwned'];

  it.each(hostile)('sign-in with callbackUrl %j answers with our home page', async (callbackUrl) => {
    const res = await attemptSignIn('installer2@nookpass.demo', demoPassword, { address: testAddress(), callbackUrl });
    expect(res.cookie).not.toBeNull();
    expect(res.url).toBe(`${origin}/home`);
  });

  it('keeps a same-origin callback path', async () => {
    const res = await attemptSignIn('installer2@nookpass.demo', demoPassword, { address: testAddress(), callbackUrl: '/projects?q=Example' });
    expect(res.url).toBe(`${origin}/projects?q=Example`);
  });

  it('sign-out with a hostile callbackUrl answers with our own page', async () => {
    const csrf = await fetch(`${baseUrl}/api/auth/csrf`);
    const jar = csrf.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
    const { csrfToken } = (await csrf.json()) as { csrfToken: string };
    const res = await fetch(`${baseUrl}/api/auth/signout`, {
      method: 'POST',
      redirect: 'manual',
      headers: { 'content-type': 'application/x-www-form-urlencoded', cookie: jar },
      body: new URLSearchParams({ csrfToken, callbackUrl: '/\\127.0.0.1:8081/pwned', json: 'true' }),
    });
    expect(((await res.json()) as { url: string }).url).toBe(`${origin}/home`);
  });

  it('sends an anonymous visitor to sign-in with a clean callbackUrl, and the forbidden page names only our paths', async () => {
    const res = await fetch(`${baseUrl}/projects?q=x`, { redirect: 'manual' });
    expect(new URL(res.headers.get('location')!, baseUrl).searchParams.get('callbackUrl')).toBe('/projects?q=x');
    const forbidden = await api('/forbidden?from=%2F%5Cevil.example%2Fpwned');
    expect(forbidden.status).toBe(200);
    expect(/evil\.example\/pwned<\/code>/.test(String(forbidden.body))).toBe(false);
    const named = await api('/forbidden?from=%2Fusers');
    expect(/<code class="font-mono">\/users<\/code>/.test(String(named.body))).toBe(true);
  });
});

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};

async function freshUser(prefix: string, password: string, cost: number): Promise<string> {
  const email = `${prefix}-${randomBytes(4).toString('hex')}@example.test`;
  const org = await db.selectFrom('organizations').select('id').where('name', '=', 'Demo Closet Works').executeTakeFirstOrThrow();
  await db
    .insertInto('users')
    .values({ email, name: 'Sign-in Test', role: 'installer', organization_id: org.id, password_hash: bcrypt.hashSync(password, cost) })
    .execute();
  return email;
}

const unknownEmail = () => `nobody-${randomBytes(5).toString('hex')}@example.test`;

describe('a wrong password and an unknown e-mail cannot be told apart by time', () => {
  it('stores demo accounts at the cost the unknown-e-mail comparison uses', async () => {
    const row = await db.selectFrom('users').select('password_hash').where('email', '=', 'installer2@nookpass.demo').executeTakeFirstOrThrow();
    expect(hashCost(row.password_hash)).toBe(PASSWORD_COST);
  });

  it('answers both in the same median time (7 of each, interleaved)', { timeout: 60_000 }, async () => {
    const known: number[] = [];
    const unknown: number[] = [];
    // Each attempt from its own address, so no counter refuses one early (a refusal would be fast).
    for (let i = 0; i < 7; i++) {
      const k = await attemptSignIn('installer2@nookpass.demo', 'not-the-password', { address: testAddress() });
      const u = await attemptSignIn(unknownEmail(), 'not-the-password', { address: testAddress() });
      expect([k.error, u.error]).toEqual(['CredentialsSignin', 'CredentialsSignin']);
      known.push(k.ms);
      unknown.push(u.ms);
    }
    const [a, b] = [median(known), median(unknown)];
    // Tolerance: a quarter of the slower median, at least 40 ms (common practice, no published source);
    // bcrypt at cost 10 against 12 differs fourfold (2^(12-10) rounds, the bcrypt paper's cost definition).
    expect(Math.abs(a - b), `median wrong password ${a.toFixed(0)} ms, unknown e-mail ${b.toFixed(0)} ms`).toBeLessThanOrEqual(Math.max(40, 0.25 * Math.max(a, b)));
  });

  it('redoes a hash made at a lower cost on the next successful sign-in', async () => {
    const email = await freshUser('rehash', 'old-cheap-hash-pw', 4);
    expect((await attemptSignIn(email, 'old-cheap-hash-pw', { address: testAddress() })).cookie).not.toBeNull();
    const row = await db.selectFrom('users').select('password_hash').where('email', '=', email).executeTakeFirstOrThrow();
    expect(hashCost(row.password_hash)).toBe(PASSWORD_COST);
    expect(await bcrypt.compare('old-cheap-hash-pw', row.password_hash)).toBe(true);
    expect((await attemptSignIn(email, 'old-cheap-hash-pw', { address: testAddress() })).cookie).not.toBeNull();
  });
});

describe('a flood of sign-ins', () => {
  it('leaves other requests answering: /api/ping median stays low while 10 sign-ins run in parallel', { timeout: 60_000 }, async () => {
    const ping = async () => {
      const t = performance.now();
      await (await fetch(`${baseUrl}/api/ping`)).arrayBuffer();
      return performance.now() - t;
    };
    const idle: number[] = [];
    for (let i = 0; i < 15; i++) idle.push(await ping());
    let running = true;
    const flood = Promise.all(Array.from({ length: 10 }, () => attemptSignIn(unknownEmail(), 'whatever-password', { address: testAddress() }))).finally(() => {
      running = false;
    });
    const during: number[] = [];
    while (running && during.length < 200) during.push(await ping());
    const results = await flood;
    expect(results.every((r) => r.error === 'CredentialsSignin')).toBe(true);
    expect(during.length).toBeGreaterThanOrEqual(3);
    // Budget: 100 ms or five times the idle median, whichever is more (common practice, no published source).
    expect(median(during), `idle ${median(idle).toFixed(1)} ms, during ${median(during).toFixed(1)} ms over ${during.length} pings`).toBeLessThanOrEqual(Math.max(100, 5 * median(idle)));
  });
});

describe('sign-in throttling', () => {
  it('slows one address trying many e-mails: the eleventh within a minute is refused with Retry-After', { timeout: 60_000 }, async () => {
    const address = testAddress();
    const answers = [];
    for (let i = 0; i < 25; i++) answers.push(await attemptSignIn(unknownEmail(), 'whatever-password', { address }));
    expect(answers.slice(0, 10).map((a) => a.error)).toEqual(Array(10).fill('CredentialsSignin'));
    for (const a of answers.slice(10)) {
      // RFC 6585 section 4: 429 Too Many Requests, with Retry-After (RFC 9110 section 10.2.3) in seconds.
      expect(a.status).toBe(429);
      expect(a.error).toBe('throttled');
      expect(Number(a.retryAfter)).toBeGreaterThan(0);
      expect(Number(a.retryAfter)).toBeLessThanOrEqual(60);
    }
    // Another address is not slowed by it.
    expect((await attemptSignIn(unknownEmail(), 'whatever-password', { address: testAddress() })).error).toBe('CredentialsSignin');
  });

  it('never counts successful sign-ins: twelve in a row from one address all get in', { timeout: 60_000 }, async () => {
    const email = await freshUser('many-successes', 'the-right-password', 4);
    const address = testAddress();
    for (let i = 0; i < 12; i++) expect((await attemptSignIn(email, 'the-right-password', { address })).cookie, `sign-in ${i + 1}`).not.toBeNull();
  });

  it('counts parallel guesses exactly: of 10 at once for one e-mail, 5 are checked and 5 refused', { timeout: 60_000 }, async () => {
    const email = await freshUser('parallel-guess', 'the-right-password', 4);
    const address = testAddress();
    const answers = await Promise.all(Array.from({ length: 10 }, () => attemptSignIn(email, 'a-wrong-password', { address })));
    expect(answers.filter((a) => a.error === 'CredentialsSignin')).toHaveLength(5);
    expect(answers.filter((a) => a.status === 429 && a.error === 'throttled')).toHaveLength(5);
  });

  it('cannot be used to lock a person out: failures from one address leave the owner elsewhere signing in', { timeout: 60_000 }, async () => {
    const email = await freshUser('lockout', 'owners-password-1', 4);
    const attacker = testAddress();
    for (let i = 0; i < 5; i++) expect((await attemptSignIn(email, `guess-${i}-password`, { address: attacker })).error).toBe('CredentialsSignin');
    const refused = await attemptSignIn(email, 'owners-password-1', { address: attacker });
    expect(refused.status).toBe(429);
    const owner = await attemptSignIn(email, 'owners-password-1', { address: testAddress() });
    expect(owner.cookie).not.toBeNull();
  });

  it('tells the throttled person the same thing the sign-in form says', async () => {
    const address = testAddress();
    const email = unknownEmail();
    for (let i = 0; i < 5; i++) await attemptSignIn(email, 'whatever-password', { address });
    const refused = await attemptSignIn(email, 'whatever-password', { address });
    expect(refused.status).toBe(429);
    expect(refused.url).toBe(`${origin}/sign-in?error=throttled`);
    expect(refused.message).toBe(THROTTLED_MESSAGE);
    expect(THROTTLED_MESSAGE).toBe('Too many failed sign-ins for this e-mail. Wait 15 minutes, then try again.');
  });
});
