import 'server-only';
import { AsyncLocalStorage } from 'node:async_hooks';
import { randomUUID } from 'node:crypto';
import pino from 'pino';

/*
 * One structured log for the app: JSON lines on standard output (pino), each line inside a request carrying that
 * request's id. The id is the caller's `X-Request-Id` when it is a sensible token (a proxy in front may set one),
 * otherwise a new UUID; every answer carries it back, and every error answer names it, so a support question
 * ("request 3f1c… failed") finds its lines.
 */

type RequestContext = { requestId: string };

// Pages and route handlers are bundled apart; one store per process keeps the id visible to both.
const globalForLog = globalThis as unknown as { nookpassRequestContext?: AsyncLocalStorage<RequestContext>; nookpassLog?: pino.Logger };

function store(): AsyncLocalStorage<RequestContext> {
  globalForLog.nookpassRequestContext ??= new AsyncLocalStorage<RequestContext>();
  return globalForLog.nookpassRequestContext;
}

export function currentRequestId(): string | undefined {
  return store().getStore()?.requestId;
}

export const log: pino.Logger = (globalForLog.nookpassLog ??= pino({
  level: process.env.NOOKPASS_LOG_LEVEL ?? 'info',
  base: { service: 'nookpass', pid: process.pid },
  timestamp: pino.stdTimeFunctions.isoTime,
  mixin() {
    const requestId = currentRequestId();
    return requestId ? { requestId } : {};
  },
  // Written from a buffer as soon as the previous write is done, not by a blocking write per line on the request
  // thread: under load, lines queued meanwhile go out in one write. pino flushes what is left when the process exits.
}, pino.destination({ dest: 1, sync: false })));

const INCOMING_ID = /^[A-Za-z0-9._:-]{8,64}$/;

/** The id for a request: the caller's X-Request-Id when it looks like one, else a new UUID. */
export function requestIdFor(request: Request): string {
  const incoming = request.headers.get('x-request-id');
  return incoming && INCOMING_ID.test(incoming) ? incoming : randomUUID();
}

/** Runs `work` with `requestId` on every log line written meanwhile. */
export function withRequestId<T>(requestId: string, work: () => T): T {
  return store().run({ requestId }, work);
}
