import 'server-only';
import { createHash, randomUUID } from 'node:crypto';
import { NextRequest } from 'next/server';
import { currentRequestId, log, requestIdFor, withRequestId } from '@/lib/platform/log';
import type { z } from 'zod';
import {
  ConfirmationRequiredError,
  ConflictError,
  DomainError,
  ForbiddenError,
  NotFoundError,
  PayloadTooLargeError,
  TooManyRequestsError,
  ServiceUnavailableError,
  UnauthorizedError,
  ValidationError,
  type FieldError,
} from '@/lib/domain/errors';

const MAX_JSON_BYTES = 512 * 1024;

export function json(body: unknown, init?: number | ResponseInit): Response {
  const opts = typeof init === 'number' ? { status: init } : init;
  return Response.json(body, { ...opts, headers: { 'cache-control': 'no-store', ...(opts?.headers ?? {}) } });
}

/** An answer already serialized as JSON (the evaluation API's, made on an evaluation thread). */
export function jsonText(body: string | Uint8Array<ArrayBuffer>, status = 200): Response {
  return new Response(body, { status, headers: { 'content-type': 'application/json', 'cache-control': 'no-store' } });
}

export function zodErrors(error: z.ZodError): FieldError[] {
  return error.issues.map((issue) => ({
    path: issue.path.map(String).join('.') || '(body)',
    message: issue.message,
  }));
}

/** Reads a JSON body: wrong content type, oversize or malformed JSON become a 400/413, never a 500. */
export async function readJson(request: Request): Promise<unknown> {
  const type = request.headers.get('content-type') ?? '';
  if (!/^application\/(.+\+)?json\b/i.test(type)) {
    throw new ValidationError([{ path: '(body)', message: 'Send the body as JSON with Content-Type: application/json.' }]);
  }
  const text = await readTextUpTo(request, MAX_JSON_BYTES);
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    throw new ValidationError([{ path: '(body)', message: 'The body is not valid JSON.' }]);
  }
  const broken = findLoneSurrogate(body);
  if (broken !== null) {
    throw new ValidationError([{ path: broken || '(body)', message: 'This text holds half of a character (a lone UTF-16 surrogate, e.g. \\ud800); send it as valid Unicode.' }]);
  }
  return body;
}

// JSON may escape half a surrogate pair ("\ud800"), which no UTF-8 text (nor PostgreSQL) can hold.
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/** The dotted path of the first key or string value with a lone surrogate ('' for the body itself), or null. */
export function findLoneSurrogate(value: unknown, path = ''): string | null {
  if (typeof value === 'string') return LONE_SURROGATE.test(value) ? path : null;
  if (value === null || typeof value !== 'object') return null;
  for (const [key, child] of Object.entries(value)) {
    const childPath = path ? `${path}.${key}` : key;
    if (LONE_SURROGATE.test(key)) return childPath;
    const found = findLoneSurrogate(child, childPath);
    if (found !== null) return found;
  }
  return null;
}

function tooLarge(limit: number, message?: string): PayloadTooLargeError {
  return new PayloadTooLargeError(message ?? `The body is over ${limit >= 1024 * 1024 ? `${limit / 1024 / 1024} MB` : `${limit / 1024} KiB`}.`);
}

/**
 * Hands the body to `onChunk` as it arrives and stops once it passes `limit` bytes: a chunked body declares
 * no length, so counting as it arrives is what keeps an endless upload from being held whole. A declared
 * length over the limit is refused before anything is read. Returns the byte count.
 */
export async function streamBodyUpTo(request: Request, limit: number, onChunk: (chunk: Uint8Array) => void, message?: string): Promise<number> {
  if (Number(request.headers.get('content-length') ?? '0') > limit) throw tooLarge(limit, message);
  if (!request.body) return 0;
  const reader = request.body.getReader();
  let size = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) return size;
    size += value.byteLength;
    if (size > limit) {
      await reader.cancel().catch(() => undefined);
      throw tooLarge(limit, message);
    }
    onChunk(value);
  }
}

/** The whole body, up to `limit` bytes (for bodies that must be held: small forms). */
export async function readBytesUpTo(request: Request, limit: number, message?: string): Promise<Buffer> {
  const chunks: Uint8Array[] = [];
  await streamBodyUpTo(request, limit, (c) => chunks.push(c), message);
  return Buffer.concat(chunks);
}

/** The body as UTF-8, up to `limit` bytes. */
export async function readTextUpTo(request: Request, limit: number, message?: string): Promise<string> {
  return new TextDecoder().decode(await readBytesUpTo(request, limit, message));
}

/** SHA-256 of the body, hashed as it arrives so nothing but the digest is kept. */
export async function hashBodyUpTo(request: Request, limit: number, message?: string): Promise<{ sha256: string; byteSize: number }> {
  const hash = createHash('sha256');
  const byteSize = await streamBodyUpTo(request, limit, (c) => hash.update(c), message);
  return { sha256: hash.digest('hex'), byteSize };
}

export async function parseBody<S extends z.ZodType>(request: Request, schema: S): Promise<z.output<S>> {
  const result = schema.safeParse(await readJson(request));
  if (!result.success) throw new ValidationError(zodErrors(result.error));
  return result.data;
}

function isDatabaseDown(err: unknown): boolean {
  const code = (err as { code?: string })?.code;
  return ['ECONNREFUSED', 'ECONNRESET', '57P01', '57P03', 'ETIMEDOUT'].includes(code ?? '') ||
    /Connection terminated|timeout exceeded when trying to connect/i.test((err as Error)?.message ?? '');
}

/**
 * PostgreSQL text and jsonb cannot hold U+0000 (22021 character_not_in_repertoire, 22P05
 * untranslatable_character): input that still carries one is the client's mistake, not ours.
 */
function isUnstorableText(err: unknown): boolean {
  const code = (err as { code?: string })?.code;
  return code === '22021' || code === '22P05';
}

/** An error answer; inside a request it names the request (`requestId`), as its X-Request-Id header does. */
function errorJson(body: Record<string, unknown>, init: number | ResponseInit): Response {
  const requestId = currentRequestId();
  return json(requestId ? { ...body, requestId } : body, init);
}

export function errorResponse(err: unknown): Response {
  if (err instanceof ValidationError) return errorJson({ error: err.message, errors: err.errors }, 400);
  if (isUnstorableText(err)) {
    return errorJson({ error: 'The request was refused.', errors: [{ path: '(request)', message: 'Text in the request cannot contain the NUL character (U+0000); remove it and try again.' }] }, 400);
  }
  if (err instanceof UnauthorizedError) return errorJson({ error: err.message }, 401);
  if (err instanceof ForbiddenError) return errorJson({ error: err.message }, 403);
  if (err instanceof NotFoundError) return errorJson({ error: err.message }, 404);
  if (err instanceof ConfirmationRequiredError) {
    return errorJson(
      {
        error: err.message,
        errors: [{ path: err.path, message: err.message }],
        needsConfirmation: true,
        ...(err.reason ? { reason: err.reason } : {}),
        ...(err.details ?? {}),
      },
      409,
    );
  }
  if (err instanceof ConflictError) return errorJson({ error: err.message }, 409);
  if (err instanceof PayloadTooLargeError) return errorJson({ error: err.message }, 413);
  // RFC 6585 §4: 429 with how long to wait.
  if (err instanceof TooManyRequestsError) return errorJson({ error: err.message }, { status: 429, headers: { 'retry-after': String(err.retryAfterSeconds) } });
  if (err instanceof ServiceUnavailableError) return errorJson({ error: err.message }, { status: 503, headers: { 'retry-after': '5' } });
  if (isDatabaseDown(err)) {
    return errorJson({ error: 'The database is not reachable right now; nothing was changed. Try again in a moment.' }, 503);
  }
  const requestId = currentRequestId() ?? randomUUID();
  log.error({ err: err instanceof DomainError ? { message: err.message } : err, requestId }, 'request failed');
  return json({ error: 'Something went wrong on our side.', requestId }, 500);
}

/** Names the request in its answer's X-Request-Id header (error bodies name it too, through errorJson). */
function stamped(response: Response, requestId: string): Response {
  try {
    response.headers.set('x-request-id', requestId);
    return response;
  } catch {
    // A response whose headers are immutable (one passed through from fetch): copy it.
    const headers = new Headers(response.headers);
    headers.set('x-request-id', requestId);
    return new Response(response.body, { status: response.status, statusText: response.statusText, headers });
  }
}

type Handler<C> = (request: Request, context: C) => Promise<Response>;

/** Wraps a route handler so every thrown domain error becomes its status, in one place. */
export function route<C = unknown>(handler: Handler<C>): Handler<C> {
  return (request, context) => {
    const requestId = requestIdFor(request);
    return withRequestId(requestId, async () => {
      const started = performance.now();
      let response: Response;
      try {
        response = await handler(request, context);
      } catch (err) {
        response = errorResponse(err);
      }
      const path = new URL(request.url).pathname;
      const fields = { method: request.method, path, status: response.status, ms: Math.round((performance.now() - started) * 10) / 10 };
      if (response.status >= 500) log.warn(fields, 'request answered with an error');
      else log.info(fields, 'request');
      return stamped(response, requestId);
    });
  };
}

/**
 * For a library that reads the whole body itself (next-auth's handler calls request.text()): the body is
 * read here first, within `limit`, and the handler gets a copy that holds just those bytes.
 */
export function withBodyLimit<C>(handler: (request: NextRequest, context: C) => Promise<Response>, limit: number) {
  return async (request: NextRequest, context: C): Promise<Response> => {
    let bytes: Buffer;
    try {
      bytes = await readBytesUpTo(request, limit);
    } catch (err) {
      return errorResponse(err);
    }
    const copy = new NextRequest(request.url, { method: request.method, headers: request.headers, body: request.body ? new Uint8Array(bytes) : undefined });
    return handler(copy, context);
  };
}
