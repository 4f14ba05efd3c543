import { performance } from 'node:perf_hooks';
import { Engine, type RuleProperties } from 'json-rules-engine';
import { evaluate, toEngineRules } from '@/lib/domain/engine';
import { computeFacts } from '@/lib/domain/facts';
import { parsePlan } from '@/lib/domain/plan';
import { buildRuleSet } from '@/rules';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';

export interface BenchResult {
  /** Mean milliseconds per evaluate() call. */
  engineMs: number;
  /** Mean milliseconds per raw json-rules-engine run on the same rules and precomputed facts. */
  rawMs: number;
  /** engineMs / rawMs; the goal is at most 1.5. */
  ratio: number;
  iterations: number;
}

/**
 * Times evaluate() on a full plan against json-rules-engine alone on the same rules with the same
 * facts computed once beforehand; both build a fresh Engine every iteration. Batches alternate so
 * drift in the machine's speed affects both sides alike.
 */
export async function measureEngineOverhead(options: { iterations?: number; batches?: number } = {}): Promise<BenchResult> {
  const iterations = options.iterations ?? 2000;
  const batches = options.batches ?? 10;
  const parsed = parsePlan(hallClosetPassPlan);
  if (!parsed.ok) throw new Error('demo plan does not parse');
  const plan = parsed.plan;
  const built = buildRuleSet({
    building: 'IRC 2018',
    electrical: 'NEC 2020',
    plumbing: 'IPC 2018',
    plumbingFamily: 'IPC',
    mechanical: 'IMC 2018',
    fuelGas: 'IFGC 2018',
  });
  const ruleSet = { id: 'bench-rule-set', jurisdiction: 'Benchmark', version: 1, ...built };
  const facts = computeFacts(plan, built.parameters);
  const rawRules: RuleProperties[] = built.rules.flatMap((rule) => {
    const { main, applicability } = toEngineRules(rule);
    return applicability ? [applicability, main] : [main];
  });

  const runEngine = () => evaluate(ruleSet, plan);
  const runRaw = async () => {
    const engine = new Engine(rawRules, { allowUndefinedFacts: true });
    engine.addFact('params', built.parameters);
    for (const [name, value] of Object.entries(facts)) engine.addFact(name, value);
    return engine.run();
  };

  const time = async (fn: () => Promise<unknown>, count: number) => {
    const start = performance.now();
    for (let i = 0; i < count; i += 1) await fn();
    return performance.now() - start;
  };

  const warmup = Math.max(50, Math.floor(iterations / 10));
  await time(runEngine, warmup);
  await time(runRaw, warmup);

  const perBatch = Math.max(1, Math.floor(iterations / batches));
  let engineTotal = 0;
  let rawTotal = 0;
  for (let b = 0; b < batches; b += 1) {
    if (b % 2 === 0) {
      engineTotal += await time(runEngine, perBatch);
      rawTotal += await time(runRaw, perBatch);
    } else {
      rawTotal += await time(runRaw, perBatch);
      engineTotal += await time(runEngine, perBatch);
    }
  }
  const count = perBatch * batches;
  const engineMs = engineTotal / count;
  const rawMs = rawTotal / count;
  return { engineMs, rawMs, ratio: engineMs / rawMs, iterations: count };
}

async function main(): Promise<void> {
  const result = await measureEngineOverhead();
  const ops = (ms: number) => (1000 / ms).toFixed(0);
  console.log(`evaluate():          ${ops(result.engineMs)} ops/s (${result.engineMs.toFixed(3)} ms each)`);
  console.log(`json-rules-engine:   ${ops(result.rawMs)} ops/s (${result.rawMs.toFixed(3)} ms each)`);
  console.log(`ratio:               ${result.ratio.toFixed(2)}x (goal <= 1.5x) over ${result.iterations} iterations each`);
}

// Run only when invoked directly (npx tsx tests/bench/engine-bench.ts), not when imported.
if (/engine-bench\.[cm]?[jt]s$/.test(process.argv[1] ?? '')) {
  main().catch((error) => {
    console.error(error);
    process.exitCode = 1;
  });
}
