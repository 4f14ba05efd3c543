import path from 'node:path';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { evaluationAnswer } from '@/lib/domain/api/evaluation-answer';
import { ServiceUnavailableError } from '@/lib/domain/errors';
import { answerOffThread, closeEvaluationPool } from '@/lib/platform/evaluation/evaluation-pool';
import { buildRuleSet } from '@/rules';
import { buildEvaluationWorker } from '@/scripts/build-report-worker.mjs';
import { longestStallMs } from '@/tests/fixtures/event-loop';
import { generatedPlan } from '@/tests/fixtures/generated-plans';
import { hallClosetPassPlan, longExhaustFailPlan } from '@/tests/fixtures/plans';

/*
 * The evaluation API evaluates on worker threads running the bundle `npm run build` makes
 * (scripts/build-report-worker.mjs), built here into test-results/. The answer must be the very text the
 * request thread would have written, for every plan and whichever version a thread was sent first, and the
 * calling thread's loop must stay free while a burst of evaluations runs.
 */

const EDITIONS_2018 = { building: 'IRC 2018', electrical: 'NEC 2017', plumbing: 'IPC 2018', plumbingFamily: 'IPC' as const, mechanical: 'IMC 2018', fuelGas: 'IFGC 2018' };
const EDITIONS_2012 = { building: 'IRC 2012', electrical: 'NEC 2011', plumbing: 'IPC 2012', plumbingFamily: 'IPC' as const, mechanical: 'IMC 2012', fuelGas: 'IFGC 2012' };
const v2018 = { id: 'pool-2018', jurisdiction: 'pool-county', version: 3, ...buildRuleSet(EDITIONS_2018) };
const v2012 = { id: 'pool-2012', jurisdiction: 'older-county', version: 1, ...buildRuleSet(EDITIONS_2012) };

beforeAll(async () => {
  process.env.NOOKPASS_EVALUATION_WORKER = await buildEvaluationWorker(path.join(process.cwd(), 'test-results', 'evaluation-worker', 'evaluate-worker.mjs'));
  process.env.NOOKPASS_EVALUATION_THREADS = '2';
  await closeEvaluationPool(); // a pool made before the settings above would be in-process
}, 60_000);

afterAll(async () => {
  await closeEvaluationPool();
  delete process.env.NOOKPASS_EVALUATION_WORKER;
  delete process.env.NOOKPASS_EVALUATION_THREADS;
});

// The threads answer in UTF-8 bytes, ready to send; read back as text to compare.
const asText = (answer: Awaited<ReturnType<typeof answerOffThread>>) => (answer.ok ? { ok: true, body: new TextDecoder().decode(answer.body) } : answer);
const findingOf = (body: string, key: string) => (JSON.parse(body).findings as { ruleKey: string; status: string; citation: { section: string } }[]).find((f) => f.ruleKey === key);

describe('evaluations on worker threads', () => {
  it('answer with the same text as the request thread, each under its own version', async () => {
    for (const ruleSet of [v2018, v2012, v2018]) {
      for (const plan of [hallClosetPassPlan, longExhaustFailPlan]) {
        for (const wanted of ['all', 'failing'] as const) {
          const off = asText(await answerOffThread(ruleSet, plan, wanted));
          expect(off).toEqual(await evaluationAnswer(ruleSet, plan, wanted));
        }
      }
    }
    const long2018 = asText(await answerOffThread(v2018, longExhaustFailPlan, 'all'));
    const long2012 = asText(await answerOffThread(v2012, longExhaustFailPlan, 'all'));
    if (!long2018.ok || !long2012.ok) throw new Error('the fixture plan should parse');
    // IRC 2018 M1502.4.5.1 and IRC 2012 M1502.4.4.1: the same 35 ft limit under two section numbers.
    expect(findingOf(long2018.body, 'exhaust.developed-length')).toMatchObject({ status: 'fail', citation: { section: 'M1502.4.5.1' } });
    expect(findingOf(long2012.body, 'exhaust.developed-length')).toMatchObject({ status: 'fail', citation: { section: 'M1502.4.4.1' } });
    expect(JSON.parse(long2012.body).ruleSet).toEqual({ jurisdiction: 'older-county', version: 1 });
  });

  it('answer like the request thread for generated plans too', async () => {
    const plans = fc.sample(generatedPlan, { numRuns: 40, seed: 20261204 });
    const off = await Promise.all(plans.map((p) => answerOffThread(v2018, p, 'all')));
    for (let i = 0; i < plans.length; i++) expect(asText(off[i])).toEqual(await evaluationAnswer(v2018, plans[i], 'all'));
  });

  it('refuse a plan that does not parse with its fields named under plan.', async () => {
    const answer = await answerOffThread(v2018, { ...hallClosetPassPlan, enclosure: { ...hallClosetPassPlan.enclosure, width: 'wide' } }, 'all');
    expect(answer.ok).toBe(false);
    if (answer.ok) return;
    expect(answer.errors.map((e) => e.path)).toContain('plan.enclosure.width');
  });

  it('leave the calling thread free while 200 evaluations run', async () => {
    const burst = () => Promise.all(Array.from({ length: 200 }, () => answerOffThread(v2018, longExhaustFailPlan, 'all')));
    const inProcess = () => Promise.all(Array.from({ length: 200 }, () => evaluationAnswer(v2018, longExhaustFailPlan, 'all')));
    const offStall = await longestStallMs(burst, 5);
    const inStall = await longestStallMs(inProcess, 5);
    // Run on this thread, the 200 evaluations hold the loop for one long stretch; on the threads, only hand-overs.
    expect(offStall).toBeLessThan(inStall / 3);
  }, 60_000);

  it('refuse at once with 503 when too many evaluations wait', async () => {
    const many = Array.from({ length: 1_200 }, () => answerOffThread(v2018, hallClosetPassPlan, 'failing').catch((err: unknown) => err));
    const results = await Promise.all(many);
    const refused = results.filter((r) => r instanceof ServiceUnavailableError);
    expect(refused.length).toBeGreaterThan(0);
    expect((refused[0] as Error).message).toMatch(/Too many evaluations are waiting/);
    expect(results.filter((r) => !(r instanceof Error)).length).toBeGreaterThanOrEqual(1_000);
  }, 60_000);
});
