import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, type DB } from '@/db/index';
import { migrateToLatest } from '@/db/migrator';
import { claimRuleSetRun, findRuleSetRun, insertRuleSetRun } from '@/db/rule-set-runs';
import { createDraft, findPublishedRuleSet } from '@/db/rule-sets';
import { SCALE_SLUG_PREFIX, writeScaleScenario } from '@/db/scale-seed';
import { computeImpact, evaluateDryRun } from '@/lib/services/rule-sets/comparisons';
import { seedDemo } from '@/lib/services/demo-seed';
import { executeRuleSetRun } from '@/lib/services/rule-sets/runs';
import { createScratchDb } from './helpers';

/*
 * The job's own path, run in this process against a scratch database holding the demo scenario and a small scale
 * scenario (two published versions per scale jurisdiction, so the impact run re-evaluates stored checks): the stored
 * result equals a direct call of the function the synchronous routes use, progress rises to the total, and a
 * second or concurrent job for the same run does nothing.
 */

let scratch: Awaited<ReturnType<typeof createScratchDb>>;
let db: DB;
let adminId: string;
let scaleJurisdiction: { id: string; slug: string };
let demoCity: { id: string };

/** What a JSON column gives back: the direct result with its dates as text, as the API answers it. */
const asStored = (value: unknown) => JSON.parse(JSON.stringify(value));

async function newRun(kind: 'impact' | 'dry-run', jurisdictionId: string, ruleSetId: string) {
  const set = await db.selectFrom('rule_sets').select(['version', 'revision']).where('id', '=', ruleSetId).executeTakeFirstOrThrow();
  return insertRuleSetRun(db, { kind, jurisdictionId, ruleSetId, ruleSetVersion: set.version, draftRevision: kind === 'dry-run' ? set.revision : null, requestedBy: adminId });
}

async function draftWithShorterExhaust(jurisdictionId: string) {
  const published = (await findPublishedRuleSet(db, jurisdictionId))!;
  // An invented local amendment: 20 ft instead of the 35 ft of IRC 2021 M1502.4.6.1, so plans over 20 ft change.
  const parameters = {
    ...published.parameters,
    exhaust: { ...published.parameters.exhaust, maxDevelopedLengthIn: 240 },
    amendments: [...(published.parameters.amendments ?? []).filter((a) => a.parameter !== 'exhaust.maxDevelopedLengthIn'), { parameter: 'exhaust.maxDevelopedLengthIn', citation: 'Ord. T-9 (test)' }],
  };
  return createDraft(db, { jurisdictionId, parameters, rules: published.rules, basedOnId: published.id, actorUserId: adminId, source: 'test' });
}

const dryRunAudits = async (draftId: string) =>
  Number((await db.selectFrom('audit_log').select(sql<string>`count(*)`.as('n')).where('entity_id', '=', draftId).where('action', '=', 'rule-set.dry-run').executeTakeFirstOrThrow()).n);

beforeAll(async () => {
  scratch = await createScratchDb();
  const { error } = await migrateToLatest(scratch.db);
  if (error) throw error;
  db = scratch.db;
  await seedDemo(db);
  const single = createDb(scratch.url, 1);
  await writeScaleScenario(single, 'not-a-password-hash', { projects: 40, revisionsPerProject: 2, jurisdictions: 1 });
  await single.destroy();
  adminId = (await db.selectFrom('users').select('id').where('email', '=', 'admin@nookpass.demo').executeTakeFirstOrThrow()).id;
  scaleJurisdiction = await db.selectFrom('jurisdictions').select(['id', 'slug']).where('slug', 'like', `${SCALE_SLUG_PREFIX}%`).executeTakeFirstOrThrow();
  demoCity = await db.selectFrom('jurisdictions').select('id').where('slug', '=', 'demo-city').executeTakeFirstOrThrow();
}, 180_000);

afterAll(async () => {
  delete process.env.NOOKPASS_RUN_BATCH_SIZE;
  await scratch?.drop();
});

describe('an impact run done by the job', () => {
  it('stores what computeImpact gives, over every open project of the jurisdiction', { timeout: 120_000 }, async () => {
    const published = (await findPublishedRuleSet(db, scaleJurisdiction.id))!;
    const run = await newRun('impact', scaleJurisdiction.id, published.id);
    expect(await executeRuleSetRun(db, run.id, { lastTry: false })).toBe('done');
    const stored = (await findRuleSetRun(db, run.id))!;
    const direct = await computeImpact(db, scaleJurisdiction.id);
    expect(stored.result).toEqual(asStored(direct));
    expect(stored).toMatchObject({ state: 'done', done: direct.items.length, total: direct.items.length, attempts: 1, error: null });
    // The scale scenario's checks ran under the first version: the impact run really re-evaluated them.
    expect(direct.items.filter((i) => i.state === 'would-change' || i.state === 'unchanged').length).toBeGreaterThan(0);
  });

  it('answers for the demo data the same as computeImpact', async () => {
    const published = (await findPublishedRuleSet(db, demoCity.id))!;
    const run = await newRun('impact', demoCity.id, published.id);
    expect(await executeRuleSetRun(db, run.id, { lastTry: false })).toBe('done');
    expect((await findRuleSetRun(db, run.id))!.result).toEqual(asStored(await computeImpact(db, demoCity.id)));
  });

  it('fails for good, with the reason, when its version is no longer the published one', async () => {
    const published = (await findPublishedRuleSet(db, demoCity.id))!;
    const run = await newRun('impact', demoCity.id, published.id);
    await db.updateTable('rule_set_runs').set({ rule_set_version: 1, rule_set_id: null }).where('id', '=', run.id).execute();
    expect(await executeRuleSetRun(db, run.id, { lastTry: false })).toBe('failed');
    expect(await findRuleSetRun(db, run.id)).toMatchObject({ state: 'failed', result: null, error: expect.stringContaining('no longer the published version') });
  });
});

describe('a dry run done by the job', () => {
  let draftId: string;
  beforeAll(async () => {
    draftId = (await draftWithShorterExhaust(scaleJurisdiction.id)).id;
  });

  it('stores what evaluateDryRun gives, with one audit entry', { timeout: 120_000 }, async () => {
    const run = await newRun('dry-run', scaleJurisdiction.id, draftId);
    expect(await executeRuleSetRun(db, run.id, { lastTry: false })).toBe('done');
    const stored = (await findRuleSetRun(db, run.id))!;
    const direct = await evaluateDryRun(db, draftId);
    expect(stored.result).toEqual(asStored(direct));
    expect(stored.total).toBe(direct.subjects.length);
    // The demo plans and the scale projects; the 20 ft amendment changes some of them.
    expect(direct.totals.changed).toBeGreaterThan(0);
    expect(await dryRunAudits(draftId)).toBe(1);
  });

  it('reports progress in batches that rise to the total', async () => {
    const seen: Array<[number, number]> = [];
    const direct = await evaluateDryRun(db, draftId, { batchSize: 7, onBatch: async (done, total) => void seen.push([done, total]) });
    const total = direct.subjects.length;
    const expected: Array<[number, number]> = [];
    for (let done = 0; done < total; done += 7) expected.push([done, total]);
    expected.push([total, total]);
    expect(seen).toEqual(expected);
  });

  it('writes rising progress to the run while it works', { timeout: 120_000 }, async () => {
    process.env.NOOKPASS_RUN_BATCH_SIZE = '1';
    const run = await newRun('dry-run', scaleJurisdiction.id, draftId);
    const watcher = createDb(scratch.url, 1);
    const counts: number[] = [];
    let working = true;
    const watching = (async () => {
      while (working) {
        const row = await watcher.selectFrom('rule_set_runs').select(['done_count', 'total_count']).where('id', '=', run.id).executeTakeFirstOrThrow();
        if (row.total_count !== null) counts.push(row.done_count);
        await new Promise((resolve) => setTimeout(resolve, 1));
      }
    })();
    try {
      expect(await executeRuleSetRun(db, run.id, { lastTry: false })).toBe('done');
    } finally {
      working = false;
      await watching;
      await watcher.destroy();
      delete process.env.NOOKPASS_RUN_BATCH_SIZE;
    }
    const stored = (await findRuleSetRun(db, run.id))!;
    expect(counts.length).toBeGreaterThan(2);
    expect(counts).toEqual([...counts].sort((a, b) => a - b));
    expect(counts.some((n) => n > 0 && n < stored.total!)).toBe(true);
    expect(counts.at(-1)).toBe(stored.total);
  });

  it('does nothing for a second job of a finished run, and one of two concurrent jobs wins', { timeout: 120_000 }, async () => {
    const run = await newRun('dry-run', scaleJurisdiction.id, draftId);
    const before = await dryRunAudits(draftId);
    const outcomes = await Promise.all([executeRuleSetRun(db, run.id, { lastTry: false }), executeRuleSetRun(db, run.id, { lastTry: false })]);
    expect(outcomes.sort()).toEqual(['done', 'not-claimed']);
    const finished = (await findRuleSetRun(db, run.id))!;
    expect(await executeRuleSetRun(db, run.id, { lastTry: true })).toBe('not-claimed');
    expect(await findRuleSetRun(db, run.id)).toEqual(finished);
    expect(finished.done).toBe(finished.total);
    expect(await dryRunAudits(draftId)).toBe(before + 1);
  });

  it('takes over a run whose worker died and counts from zero, not on top', { timeout: 120_000 }, async () => {
    const run = await newRun('dry-run', scaleJurisdiction.id, draftId);
    const dead = (await claimRuleSetRun(db, run.id, 120))!;
    await db.updateTable('rule_set_runs').set({ done_count: 5, total_count: 50 }).where('id', '=', run.id).execute();
    // Its claim is fresh: nobody else may take it yet.
    expect(await executeRuleSetRun(db, run.id, { lastTry: false })).toBe('not-claimed');
    await db.updateTable('rule_set_runs').set({ claimed_at: sql<Date>`now() - interval '10 minutes'` }).where('id', '=', run.id).execute();
    expect(await executeRuleSetRun(db, run.id, { lastTry: false })).toBe('done');
    const stored = (await findRuleSetRun(db, run.id))!;
    expect(stored).toMatchObject({ state: 'done', attempts: 2 });
    expect(stored.done).toBe(stored.total);
    expect(stored.result).toEqual(asStored(await evaluateDryRun(db, draftId)));
    // The dead worker's claim is gone: were it to wake, it could write nothing.
    const late = await db.updateTable('rule_set_runs').set({ done_count: 1 }).where('id', '=', run.id).where('claim_token', '=', dead.token).executeTakeFirst();
    expect(Number(late.numUpdatedRows)).toBe(0);
  });

  it('keeps a finished run as it is: no change, no delete', async () => {
    const run = await newRun('dry-run', scaleJurisdiction.id, draftId);
    await executeRuleSetRun(db, run.id, { lastTry: false });
    await expect(db.updateTable('rule_set_runs').set({ result: '{}' }).where('id', '=', run.id).execute()).rejects.toThrow(/cannot change/);
    await expect(db.deleteFrom('rule_set_runs').where('id', '=', run.id).execute()).rejects.toThrow(/kept/);
  });

  it('outlives its draft: discarding the draft keeps the finished run, unlinked', async () => {
    const other = (await draftWithShorterExhaust(demoCity.id)).id;
    const run = await newRun('dry-run', demoCity.id, other);
    expect(await executeRuleSetRun(db, run.id, { lastTry: false })).toBe('done');
    const done = (await findRuleSetRun(db, run.id))!;
    await db.deleteFrom('rule_sets').where('id', '=', other).execute();
    expect(await findRuleSetRun(db, run.id)).toEqual({ ...done, ruleSetId: null });
  });
});
