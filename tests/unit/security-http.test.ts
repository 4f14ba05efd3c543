import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { PayloadTooLargeError, ValidationError } from '@/lib/domain/errors';
import { parseBody, readJson, route } from '@/lib/platform/http';

const KiB = 1024;
// lib/platform/http.ts refuses JSON bodies over 512 KiB; a full plan is a few KiB, so this is generous.
const LIMIT = 512 * KiB;

/** A body that arrives in chunks with no Content-Length (HTTP/1.1 chunked coding), counting what the reader pulled. */
function streamedRequest(totalBytes: number, chunkBytes = 64 * KiB, fill = 0x20) {
  let sent = 0;
  const body = new ReadableStream<Uint8Array>({
    pull(controller) {
      if (sent >= totalBytes) return controller.close();
      const n = Math.min(chunkBytes, totalBytes - sent);
      sent += n;
      controller.enqueue(new Uint8Array(n).fill(fill));
    },
  });
  const request = new Request('http://127.0.0.1/api/x', {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body,
    duplex: 'half',
  } as RequestInit);
  return { request, pulled: () => sent };
}

describe('readJson size limit', () => {
  it('stops reading a chunked body soon after it passes the limit, instead of buffering all of it', async () => {
    const { request, pulled } = streamedRequest(64 * 1024 * KiB);
    await expect(readJson(request)).rejects.toBeInstanceOf(PayloadTooLargeError);
    // The limit plus at most a chunk or two already queued; far from the 64 MiB on offer.
    expect(pulled()).toBeLessThanOrEqual(LIMIT + 3 * 64 * KiB);
  });

  it('refuses a declared Content-Length over the limit without reading a byte', async () => {
    let pulled = 0;
    const body = new ReadableStream<Uint8Array>({
      pull(controller) {
        pulled++;
        controller.enqueue(new TextEncoder().encode('{'));
        controller.close();
      },
    }, { highWaterMark: 0 }); // pull only when read, so the count shows whether anything read it
    const request = new Request('http://127.0.0.1/api/x', {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'content-length': String(LIMIT + 1) },
      body,
      duplex: 'half',
    } as RequestInit);
    await expect(readJson(request)).rejects.toBeInstanceOf(PayloadTooLargeError);
    expect(pulled).toBe(0);
  });

  it('accepts a body of exactly the limit and refuses one byte more', async () => {
    const json = (bytes: number) => `{"pad":"${'x'.repeat(bytes - 10)}"}`;
    expect(Buffer.byteLength(json(LIMIT))).toBe(LIMIT);
    const ok = new Request('http://127.0.0.1/api/x', { method: 'POST', headers: { 'content-type': 'application/json' }, body: json(LIMIT) });
    expect(await readJson(ok)).toEqual({ pad: 'x'.repeat(LIMIT - 10) });
    const over = streamedRequest(LIMIT + 1);
    await expect(readJson(over.request)).rejects.toBeInstanceOf(PayloadTooLargeError);
  });

  it('decodes a multi-byte character split across two chunks', async () => {
    const bytes = new TextEncoder().encode('{"name":"Küche"}');
    const cut = bytes.indexOf(0xc3) + 1; // between the two bytes of ü (UTF-8, RFC 3629)
    const body = new ReadableStream<Uint8Array>({
      start(controller) {
        controller.enqueue(bytes.slice(0, cut));
        controller.enqueue(bytes.slice(cut));
        controller.close();
      },
    });
    const request = new Request('http://127.0.0.1/api/x', { method: 'POST', headers: { 'content-type': 'application/json' }, body, duplex: 'half' } as RequestInit);
    expect(await readJson(request)).toEqual({ name: 'Küche' });
  });

  it('becomes a 413 with a plain message through route(), and malformed JSON a 400 on (body)', async () => {
    const handler = route(async (request) => Response.json(await parseBody(request, z.strictObject({ name: z.string() }))));
    const big = await handler(streamedRequest(2 * LIMIT).request, undefined);
    expect(big.status).toBe(413);
    expect((await big.json()).error).toBe('The body is over 512 KiB.');
    const bad = await handler(new Request('http://127.0.0.1/api/x', { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{"name":' }), undefined);
    expect(bad.status).toBe(400);
    expect((await bad.json()).errors).toEqual([{ path: '(body)', message: 'The body is not valid JSON.' }]);
  });

  it('names the path of a schema error', async () => {
    const request = new Request('http://127.0.0.1/api/x', { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{"a":{"b":[1,"x"]}}' });
    const err = await parseBody(request, z.strictObject({ a: z.strictObject({ b: z.array(z.number()) }) })).catch((e) => e);
    expect(err).toBeInstanceOf(ValidationError);
    expect((err as ValidationError).errors.map((e) => e.path)).toEqual(['a.b.1']);
  });
});
