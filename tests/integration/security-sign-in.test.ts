import { afterAll, describe, expect, it } from 'vitest';
import { api, appDb, attemptSignIn, baseUrl, testAddress } from './helpers';

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
    const res = await attemptSignIn('installer2@nookpass.demo', process.env.NOOKPASS_DEMO_PASSWORD || 'demo-password', { address: testAddress(), callbackUrl });
    expect(res.cookie).not.toBeNull();
    expect(res.url).toBe(`${origin}/home`);
  });

  it('keeps a same-origin callback path', async () => {
    const res = await attemptSignIn('installer2@nookpass.demo', process.env.NOOKPASS_DEMO_PASSWORD || 'demo-password', { address: testAddress(), callbackUrl: '/projects?q=Example' });
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
