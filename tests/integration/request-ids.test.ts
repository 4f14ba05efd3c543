import { randomBytes } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { api, postJson } from './helpers';

/** The served app's standard output, which npm test writes to this file. */
function appLogLines(): Record<string, unknown>[] {
  const file = process.env.NOOKPASS_APP_LOG;
  if (!file) throw new Error('NOOKPASS_APP_LOG is not set: run the integration tests through npm test.');
  return readFileSync(file, 'utf8')
    .split('\n')
    .filter((line) => line.startsWith('{'))
    .map((line) => JSON.parse(line) as Record<string, unknown>);
}

async function until<T>(find: () => T | undefined, ms = 3_000): Promise<T> {
  const start = Date.now();
  for (;;) {
    const found = find();
    if (found !== undefined) return found;
    if (Date.now() - start > ms) throw new Error(`not logged within ${ms} ms`);
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
}

describe('request ids', () => {
  it('every answer names its request; an error answer carries the id in its body, and the log line has it', async () => {
    const id = `it-${randomBytes(8).toString('hex')}`;
    const refused = await api('/api/projects', { headers: { 'x-request-id': id } });
    expect(refused.status).toBe(401);
    expect(refused.headers.get('x-request-id')).toBe(id);
    expect(refused.body.requestId).toBe(id);
    expect(refused.body.error).toBeTruthy();

    const line = await until(() => appLogLines().find((l) => l.requestId === id));
    expect(line).toMatchObject({ level: 30, msg: 'request', method: 'GET', path: '/api/projects', status: 401, service: 'nookpass' });
    expect(typeof line.ms).toBe('number');
    expect(typeof line.time).toBe('string');
  });

  it('a 400 names the request too, and an id that is not a sensible token is replaced by a new one', async () => {
    const bad = await api('/api/evaluations', postJson({ jurisdiction: '' }, { headers: { 'x-request-id': 'no spaces <allowed>' } }));
    expect(bad.status).toBe(401);
    const own = bad.headers.get('x-request-id');
    // RFC 9562 UUID (version 4), made by the server.
    expect(own).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
    expect(bad.body.requestId).toBe(own);
  });

  it('a successful answer carries the header and keeps its body as it was', async () => {
    const ok = await api('/api/health');
    expect(ok.status).toBe(200);
    expect(ok.headers.get('x-request-id')).toBeTruthy();
    expect(ok.body).toEqual({ ok: true, db: 'up' });
  });
});
