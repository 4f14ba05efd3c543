import { createRequire } from 'node:module';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { encode } from 'next-auth/jwt';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { authOptions } from '@/lib/platform/auth/options';

// The session row lookup is the database's business; here every session is live.
vi.mock('@/lib/platform/auth/sessions', async (importOriginal) => ({
  ...(await importOriginal<typeof import('@/lib/platform/auth/sessions')>()),
  requireLiveSession: vi.fn(async () => ({
    id: '00000000-0000-4000-8000-000000000001',
    expiresAt: new Date(Date.now() + 3600_000),
    user: { id: 'u-1', email: 'unit@example.test', name: 'Unit', role: 'installer', organizationId: null, jurisdictionId: null, isOwner: false, isDemo: false },
  })),
}));

const SECRET = 'unit-test-secret-not-used-anywhere-else';

// The core that NextAuth() runs behind our route handler; the package's exports map hides it, so it is loaded by file.
const { AuthHandler } = createRequire(import.meta.url)(join(process.cwd(), 'node_modules/next-auth/core/index.js')) as {
  AuthHandler: (params: { req: Request; options: unknown }) => Promise<{ cookies?: unknown[] }>;
};

type InternalCookie = { name: string; value: string; options: { httpOnly?: boolean; sameSite?: string; secure?: boolean; path?: string; domain?: string } };

/** Runs next-auth's own session endpoint with our options behind the given public URL, holding a valid session. */
async function refreshedSessionCookies(publicUrl: string): Promise<InternalCookie[]> {
  vi.stubEnv('NEXTAUTH_URL', publicUrl);
  const prefix = publicUrl.startsWith('https://') ? '__Secure-' : '';
  const sessionExpiresAt = Math.floor(Date.now() / 1000) + 3600;
  const jwt = await encode({ token: { uid: 'u-1', sid: '00000000-0000-4000-8000-000000000001', sessionExpiresAt, email: 'unit@example.test', name: 'Unit' }, secret: SECRET });
  const res = await AuthHandler({
    req: new Request(`${publicUrl}/api/auth/session`, { headers: { cookie: `${prefix}next-auth.session-token=${jwt}` } }),
    options: { ...authOptions, secret: SECRET },
  });
  return (res.cookies ?? []) as InternalCookie[];
}

async function csrfCookies(publicUrl: string): Promise<InternalCookie[]> {
  vi.stubEnv('NEXTAUTH_URL', publicUrl);
  const res = await AuthHandler({ req: new Request(`${publicUrl}/api/auth/csrf`), options: { ...authOptions, secret: SECRET } });
  return (res.cookies ?? []) as InternalCookie[];
}

afterEach(() => {
  vi.unstubAllEnvs();
});

describe('session cookies', () => {
  it('are Secure and carry the __Secure- prefix when the app is served over https', async () => {
    const cookies = await refreshedSessionCookies('https://nookpass.example.test');
    const session = cookies.find((c) => c.name.endsWith('next-auth.session-token'));
    expect(session, JSON.stringify(cookies)).toBeDefined();
    // RFC 6265bis section 4.1.3.1: a __Secure- cookie must be set with Secure from a secure origin.
    expect(session!.name).toBe('__Secure-next-auth.session-token');
    expect(session!.options).toMatchObject({ secure: true, httpOnly: true, sameSite: 'lax', path: '/' });
    // No Domain attribute: the cookie stays host-only (RFC 6265 section 5.3, step 6).
    expect(session!.options.domain).toBeUndefined();
  });

  it('use the __Host- prefix for the CSRF cookie over https', async () => {
    const cookies = await csrfCookies('https://nookpass.example.test');
    const csrf = cookies.find((c) => c.name.endsWith('next-auth.csrf-token'))!;
    // RFC 6265bis section 4.1.3.2: __Host- means Secure, Path=/ and no Domain.
    expect(csrf.name).toBe('__Host-next-auth.csrf-token');
    expect(csrf.options).toMatchObject({ secure: true, httpOnly: true, sameSite: 'lax', path: '/' });
    expect(csrf.options.domain).toBeUndefined();
  });

  it('stay HttpOnly and SameSite=Lax without Secure on plain http (local development and the test server)', async () => {
    const cookies = await refreshedSessionCookies('http://127.0.0.1:3000');
    const session = cookies.find((c) => c.name.endsWith('next-auth.session-token'))!;
    expect(session.name).toBe('next-auth.session-token');
    expect(session.options).toMatchObject({ httpOnly: true, sameSite: 'lax', path: '/' });
    expect(session.options.secure).toBeFalsy();
  });

  it('are not forced insecure or renamed by our options', () => {
    // Leaving these unset is what lets next-auth follow the scheme of NEXTAUTH_URL (the tests above).
    expect(authOptions.useSecureCookies).toBeUndefined();
    expect(authOptions.cookies).toBeUndefined();
  });
});

type HeaderRule = { source: string; headers: { key: string; value: string }[] };

async function configHeaders(nodeEnv: string): Promise<Record<string, string>> {
  vi.stubEnv('NODE_ENV', nodeEnv);
  // A fresh module instance: next.config.mjs reads NODE_ENV when it loads.
  const url = `${pathToFileURL(join(process.cwd(), 'next.config.mjs')).href}?env=${nodeEnv}-${Date.now()}`;
  const mod = await import(/* @vite-ignore */ url);
  const rules = (await mod.default.headers()) as HeaderRule[];
  const all = rules.find((r) => r.source === '/:path*')!;
  return Object.fromEntries(all.headers.map((h) => [h.key.toLowerCase(), h.value]));
}

function directives(csp: string): Map<string, string[]> {
  return new Map(csp.split(';').map((d) => d.trim().split(/\s+/)).filter((d) => d[0]).map(([name, ...values]) => [name, values]));
}

describe('security headers in next.config.mjs', () => {
  it('send a content security policy that forbids framing, plugins and foreign hosts in production', async () => {
    const headers = await configHeaders('production');
    const csp = directives(headers['content-security-policy']);
    // CSP Level 3, section 6.4.2: frame-ancestors 'none' stops every embedding (clickjacking).
    expect(csp.get('frame-ancestors')).toEqual(["'none'"]);
    expect(csp.get('default-src')).toEqual(["'self'"]);
    expect(csp.get('object-src')).toEqual(["'none'"]);
    expect(csp.get('base-uri')).toEqual(["'self'"]);
    expect(csp.get('form-action')).toEqual(["'self'"]);
    // Only the dev server's hot reload needs eval; the development build shows the switch is live.
    expect(csp.get('script-src')).not.toContain("'unsafe-eval'");
    expect(directives((await configHeaders('development'))['content-security-policy']).get('script-src')).toContain("'unsafe-eval'");
    for (const [name, values] of csp) {
      expect(values.filter((v) => /^(https?:|\*)/.test(v)), name).toEqual([]);
    }
  });

  it('send nosniff, a strict referrer policy and the legacy frame guard', async () => {
    const headers = await configHeaders('production');
    // OWASP Secure Headers Project: X-Content-Type-Options: nosniff; the Fetch standard defines its effect.
    expect(headers['x-content-type-options']).toBe('nosniff');
    // W3C Referrer Policy: other origins get at most our origin, never a project URL.
    expect(headers['referrer-policy']).toBe('strict-origin-when-cross-origin');
    // RFC 7034: X-Frame-Options for browsers that predate frame-ancestors.
    expect(headers['x-frame-options']).toBe('DENY');
  });
});
