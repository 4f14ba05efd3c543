import 'server-only';
import { execFile } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, readFileSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { Piscina } from 'piscina';
import { ServiceUnavailableError } from '@/lib/domain/errors';
import type { RenderedReport } from '@/lib/platform/pdf/render';
import type { ReportData } from '@/lib/domain/reports/report-data';

/**
 * Report PDFs render in worker threads, so a long render never holds up other requests, and each
 * render has a time limit: past it the worker is stopped and the request answers 503.
 */
export const REPORT_RENDER_TIMEOUT_MS = 30_000;
/** Renders waiting for a thread beyond these are refused at once (503) rather than queued without end. */
const MAX_QUEUED_RENDERS = 8;
/** A worker that needs more heap than this is stopped by V8; the server itself is not affected. */
const WORKER_HEAP_MB = 512;
/** How much lower than the request thread the render threads run (nice levels, 0 to 19; NOOKPASS_REPORT_NICE). */
const WORKER_NICE = 10;

function workerNice(): number {
  const fromEnv = Number(process.env.NOOKPASS_REPORT_NICE);
  return Number.isInteger(fromEnv) && fromEnv >= 0 && fromEnv <= 19 ? fromEnv : WORKER_NICE;
}

// Files beside the build, loaded by path at run time, not part of the server bundle: the paths opt out
// of Turbopack's file tracing, which would otherwise take in the whole project.
const BUILD_DIR = process.env.NOOKPASS_DIST_DIR || '.next';
const BUILT_WORKER = [BUILD_DIR, 'report-worker', 'render-worker.mjs'];
const DEV_WORKER = [BUILD_DIR, 'dev', 'report-worker', 'render-worker.mjs'];
const fromRoot = (parts: string[]) => path.join(/*turbopackIgnore: true*/ process.cwd(), ...parts);

let pool: Piscina | null = null;
let poolCode: string | null = null;

/**
 * The worker's file. Production runs the bundle built after `next build`. In development the bundle is
 * rebuilt from the source before each render (esbuild, well under a second), and a changed bundle gets
 * fresh threads, so an edit to the report shows without a restart.
 */
async function workerFile(): Promise<string> {
  const override = process.env.NOOKPASS_REPORT_WORKER;
  if (override) return path.resolve(override);
  if (process.env.NODE_ENV === 'production') return fromRoot(BUILT_WORKER);
  const out = fromRoot(DEV_WORKER);
  await promisify(execFile)(process.execPath, [fromRoot(['scripts', 'build-report-worker.mjs']), out]);
  return out;
}

async function reportPool(): Promise<Piscina> {
  const filename = await workerFile();
  if (!existsSync(filename)) {
    throw new Error(`The report worker ${filename} is missing: build it with 'node scripts/build-report-worker.mjs' (npm run build does).`);
  }
  const code = process.env.NODE_ENV === 'production' ? filename : createHash('sha256').update(readFileSync(filename)).digest('hex');
  if (pool && poolCode === code) return pool;
  const old = pool;
  pool = new Piscina({
    filename,
    // One core stays with the request thread: on two cores, one render at a time.
    maxThreads: Math.max(1, Math.min(4, availableParallelism() - 1)),
    minThreads: 1,
    idleTimeout: 60_000,
    maxQueue: MAX_QUEUED_RENDERS,
    resourceLimits: { maxOldGenerationSizeMb: WORKER_HEAP_MB },
    // On a busy machine the request thread is scheduled first: Linux nice applies per thread
    // (piscina applies it through @napi-rs/nice; without that package the worker runs at normal priority).
    niceIncrement: workerNice(),
  });
  poolCode = code;
  void old?.destroy();
  return pool;
}

function timeLimitMs(): number {
  const fromEnv = Number(process.env.NOOKPASS_REPORT_TIMEOUT_MS);
  return Number.isFinite(fromEnv) && fromEnv > 0 ? fromEnv : REPORT_RENDER_TIMEOUT_MS;
}

/** The same answer as renderReportPdf, rendered in the worker pool under the time limit. */
export async function renderReportOffThread(data: ReportData, options: { timeoutMs?: number } = {}): Promise<RenderedReport> {
  const limit = options.timeoutMs ?? timeLimitMs();
  let result: { pdf: Uint8Array; sha256: string; pageCount: number };
  try {
    result = await (await reportPool()).run(data, { signal: AbortSignal.timeout(limit) });
  } catch (err) {
    const e = err as { name?: string; code?: string; message?: string };
    if (e?.name === 'AbortError') {
      throw new ServiceUnavailableError(`The report took longer than ${Math.round(limit / 1000)} s to render and was stopped; nothing was recorded. Try again in a minute.`);
    }
    if (/queue is at limit/i.test(e?.message ?? '')) {
      throw new ServiceUnavailableError('Too many reports are being rendered right now; nothing was recorded. Try again in a minute.');
    }
    if (e?.code === 'ERR_WORKER_OUT_OF_MEMORY') {
      throw new ServiceUnavailableError('The report needed more memory than one report may use and was stopped; nothing was recorded.');
    }
    throw err;
  }
  // Structured clone hands back a plain Uint8Array; callers get the Buffer renderReportPdf gives.
  const pdf = Buffer.from(result.pdf.buffer, result.pdf.byteOffset, result.pdf.byteLength);
  return { pdf, sha256: result.sha256, pageCount: result.pageCount };
}

/** Stops the worker threads (tests and benchmarks, so the process can exit). */
export async function closeReportRenderPool(): Promise<void> {
  const p = pool;
  pool = null;
  poolCode = null;
  await p?.destroy();
}
