import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';

// Names resolve through this table instead of the network: what is tested is what the sender does with the
// addresses a name resolves to, at the moment it connects.
const resolved: Record<string, { address: string; family: number }[]> = {
  'private.example.test': [{ address: '10.0.0.5', family: 4 }],
  'mixed.example.test': [{ address: '93.184.215.14', family: 4 }, { address: '169.254.169.254', family: 4 }],
};
vi.mock('node:dns', async (importOriginal) => {
  const real = await importOriginal<typeof import('node:dns')>();
  const lookup = (hostname: string, options: unknown, callback: (err: Error | null, addresses: { address: string; family: number }[]) => void) => {
    const addresses = resolved[hostname];
    if (!addresses) return callback(Object.assign(new Error(`getaddrinfo ENOTFOUND ${hostname}`), { code: 'ENOTFOUND' }), []);
    callback(null, addresses);
  };
  return { ...real, default: { ...real, lookup }, lookup };
});

const { postWebhook, WEBHOOK_TIMEOUT_MS } = await import('@/lib/platform/webhooks/post');

/*
 * One delivery attempt as the webhook job makes it (lib/platform/webhooks/post.ts), against receivers on this
 * machine: the time limit ends an endpoint that never answers, a redirect is an answer and is not followed, and a
 * name that resolves to a private or link-local address is refused when connecting, not only when registered
 * (RFC 1918 10/8; RFC 3927 169.254/16, where cloud metadata services answer).
 */

let silent: Server;
let redirecting: Server;
let target: Server;
let targetHits = 0;
const urlOf = (s: Server, path = '/hook') => `http://127.0.0.1:${(s.address() as AddressInfo).port}${path}`;
const listen = (s: Server) => new Promise<void>((resolve) => s.listen(0, '127.0.0.1', resolve));

beforeAll(async () => {
  silent = createServer(() => undefined); // takes the request and never answers
  target = createServer((_req, res) => {
    targetHits += 1;
    res.end('ok');
  });
  await Promise.all([listen(silent), listen(target)]);
  redirecting = createServer((_req, res) => res.writeHead(302, { location: urlOf(target) }).end());
  await listen(redirecting);
});
afterAll(async () => {
  for (const s of [silent, redirecting, target]) {
    s.closeAllConnections();
    await new Promise((resolve) => s.close(resolve));
  }
});

describe('one webhook delivery attempt', () => {
  it('gives up on an endpoint that never answers once the time limit passes', async () => {
    expect(WEBHOOK_TIMEOUT_MS).toBe(10_000);
    const started = performance.now();
    const result = await postWebhook(urlOf(silent), '{"event":"report.sent"}', {}, 1_000);
    const elapsed = performance.now() - started;
    expect(result).toEqual({ ok: false, status: null, error: 'No answer within 1 s.' });
    expect(elapsed).toBeGreaterThanOrEqual(950);
    expect(elapsed).toBeLessThan(5_000);
  });

  it('takes a redirect as the answer and does not follow it', async () => {
    const result = await postWebhook(urlOf(redirecting), '{}', {}, 5_000);
    expect(result).toEqual({ ok: false, status: 302, error: 'The endpoint answered 302 (redirects are not followed).' });
    expect(targetHits).toBe(0);
    expect(await postWebhook(urlOf(target), '{}', {}, 5_000)).toEqual({ ok: true, status: 200 });
    expect(targetHits).toBe(1);
  });

  it('refuses, when connecting, a name that resolves to a private or link-local address', async () => {
    const privateName = await postWebhook('https://private.example.test/in', '{}', {}, 5_000);
    expect(privateName).toMatchObject({ ok: false, status: null });
    expect((privateName as { error: string }).error).toMatch(/^private\.example\.test resolves to an address webhooks may not reach\. .*private, link-local or reserved/);
    // One public address among them is not enough: every address the name gives is checked.
    const mixed = await postWebhook('https://mixed.example.test/in', '{}', {}, 5_000);
    expect((mixed as { error: string }).error).toMatch(/^mixed\.example\.test resolves to an address webhooks may not reach/);
  });
});
