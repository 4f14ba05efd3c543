import 'server-only';
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import path from 'node:path';
import { Piscina } from 'piscina';
import type { FindingsWanted } from '@/lib/domain/api/evaluation-answer';
import type { RuleSetForEvaluation } from '@/lib/domain/engine';
import { ServiceUnavailableError } from '@/lib/domain/errors';
import { log } from '@/lib/platform/log';
import { encodedAnswer, type EncodedAnswer, type EvaluationReply, type EvaluationTask } from '@/lib/platform/evaluation/evaluate-worker';

/**
 * The evaluation API runs the engine on evaluation threads: parsing, evaluating and serializing a plan is most of
 * the route's work, and on the request thread it would hold up every other request while it runs. A thread keeps
 * the published versions it has been sent (they never change), so a task carries only the plan after the first.
 *
 * Threads: NOOKPASS_EVALUATION_THREADS (default: one fewer than the cores, at least one, at most four); 0 runs
 * evaluations on the request thread, as development does unless NOOKPASS_EVALUATION_WORKER names a built worker.
 */

/** Evaluations waiting for a thread beyond this are refused at once (503) rather than queued without end. */
const MAX_QUEUED = 1_000;
const WORKER_HEAP_MB = 256;
/**
 * Plans a thread holds at once. One at a time, a thread that finished sits idle until the (busy) request thread
 * gets round to sending the next plan; with several sent ahead it goes straight on to the next (+≈20 % answers a
 * second at 20 connections, npm run bench). A thread still evaluates one plan after another.
 */
const TASKS_PER_THREAD = 8;

// Beside the build, loaded by path at run time; the path opts out of Turbopack's file tracing.
const BUILD_DIR = process.env.NOOKPASS_DIST_DIR || '.next';
const BUILT_WORKER = [BUILD_DIR, 'evaluation-worker', 'evaluate-worker.mjs'];
const fromRoot = (parts: string[]) => path.join(/*turbopackIgnore: true*/ process.cwd(), ...parts);

function threadCount(): number {
  const raw = process.env.NOOKPASS_EVALUATION_THREADS;
  if (raw !== undefined && raw !== '' && /^\d+$/.test(raw)) return Math.min(16, Number(raw));
  return Math.max(1, Math.min(4, availableParallelism() - 1));
}

function workerFile(): string | null {
  const override = process.env.NOOKPASS_EVALUATION_WORKER;
  if (override) return path.resolve(override);
  return process.env.NODE_ENV === 'production' ? fromRoot(BUILT_WORKER) : null;
}

let pool: Piscina | null | undefined;

function evaluationPool(): Piscina | null {
  if (pool !== undefined) return pool;
  const threads = threadCount();
  const filename = threads > 0 ? workerFile() : null;
  if (filename && !existsSync(filename)) {
    log.error({ filename }, "evaluation worker missing: evaluating on the request thread; build it with 'node scripts/build-report-worker.mjs' (npm run build does)");
    pool = null;
  } else {
    pool = filename ? new Piscina({ filename, minThreads: threads, maxThreads: threads, concurrentTasksPerWorker: TASKS_PER_THREAD, idleTimeout: 60_000, maxQueue: MAX_QUEUED, resourceLimits: { maxOldGenerationSizeMb: WORKER_HEAP_MB } }) : null;
  }
  return pool;
}

async function runTask(p: Piscina, task: EvaluationTask): Promise<EvaluationReply> {
  try {
    return await p.run(task);
  } catch (err) {
    if (/queue is at limit/i.test((err as Error)?.message ?? '')) {
      throw new ServiceUnavailableError('Too many evaluations are waiting right now; nothing was stored. Try again in a moment.');
    }
    throw err;
  }
}

/** The evaluation API's answer (UTF-8 JSON) for a plan under a published version (`id` set), computed off the request thread. */
export async function answerOffThread(ruleSet: RuleSetForEvaluation & { id: string }, plan: unknown, findings: FindingsWanted): Promise<EncodedAnswer> {
  const p = evaluationPool();
  if (!p) return encodedAnswer(ruleSet, plan, findings);
  const reply = await runTask(p, { ruleSetId: ruleSet.id, plan, findings });
  if (!('needsRuleSet' in reply)) return reply;
  const second = await runTask(p, { ruleSetId: ruleSet.id, ruleSet, plan, findings });
  if ('needsRuleSet' in second) throw new Error('The evaluation thread did not keep the rule set it was sent.');
  return second;
}

/** Stops the threads (tests and benchmarks, so the process can exit). */
export async function closeEvaluationPool(): Promise<void> {
  const p = pool;
  pool = undefined;
  await p?.destroy();
}
