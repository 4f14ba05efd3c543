import { sql } from 'kysely';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { thumbnailKeyFor } from '@/db/attachments';
import { findPublishedRuleSet } from '@/db/rule-sets';
import { insertRuleSetRun } from '@/db/rule-set-runs';
import { stopJobs } from '@/lib/platform/jobs/boss';
import { deleteObject, findObject } from '@/lib/platform/storage';
import { requeueStalledDerivatives, STALLED_DERIVATIVES_MESSAGE } from '@/lib/services/attachments/derivatives';
import { requeueStalledRuns, STALLED_RUN_MESSAGE } from '@/lib/services/rule-sets/runs';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import { api, appDb, baseUrl, postJson, signIn, until, waitForThumbnail } from './helpers';

/*
 * Work whose server stopped in the middle of it: a photo's images claimed by a worker that never finished, an
 * impact run whose progress stopped. The pass that runs every minute (called here directly, against the served
 * app's database and queue) sends it back to the queue, where the served app's workers finish it, or, once its
 * attempts are spent, ends it as failed with a reason the person can act on. Work still in progress is left alone.
 */

const db = appDb();
let installer: string;
let projectId: string;

async function uploadPhoto(name: string): Promise<{ id: string; storageKey: string }> {
  const png = await sharp({ create: { width: 900, height: 700, channels: 3, background: '#446688' } }).png().toBuffer();
  const form = new FormData();
  form.set('file', new Blob([new Uint8Array(png)], { type: 'image/png' }), name);
  form.set('caption', name);
  const res = await fetch(`${baseUrl}/api/projects/${projectId}/attachments`, { method: 'POST', headers: { cookie: installer }, body: form });
  const body = await res.json();
  expect(res.status, JSON.stringify(body)).toBe(201);
  expect((await waitForThumbnail(body.id, installer)).status).toBe('ready');
  const row = await db.selectFrom('attachments').select('storage_key').where('id', '=', body.id).executeTakeFirstOrThrow();
  return { id: body.id, storageKey: row.storage_key };
}

/** As a worker that claimed the row `minutesAgo` and then stopped with its server leaves it. */
async function claimedAndAbandoned(id: string, attempts: number, minutesAgo: number) {
  await db
    .updateTable('attachments')
    .set({ derivatives_status: 'making', derivatives_attempts: attempts, derivatives_max_attempts: 4, derivatives_claimed_at: sql<Date>`now() - make_interval(mins => ${minutesAgo})` })
    .where('id', '=', id)
    .execute();
}

const derivativesRow = (id: string) =>
  db.selectFrom('attachments').select(['derivatives_status', 'derivatives_attempts', 'derivatives_error']).where('id', '=', id).executeTakeFirstOrThrow();

beforeAll(async () => {
  installer = await signIn('installer@nookpass.demo');
  const p = await api('/api/projects', postJson({ name: 'IT stalled work (test)', siteAddress: '9 Stalled Lane', jurisdiction: 'demo-county' }, { cookie: installer }));
  expect(p.status).toBe(201);
  projectId = p.body.id;
  expect((await api(`/api/projects/${projectId}/plans`, postJson({ plan: hallClosetPassPlan }, { cookie: installer }))).status).toBe(201);
});
afterAll(async () => {
  await stopJobs();
  await db.destroy();
});

describe('work whose server stopped in the middle of it', () => {
  it('a photo claimed by a worker that stopped is made again; one on its last attempt ends failed; one in progress is left alone', { timeout: 90_000 }, async () => {
    const lost = await uploadPhoto('lost-claim.png');
    const spent = await uploadPhoto('spent-attempts.png');
    const busy = await uploadPhoto('still-working.png');
    await deleteObject(thumbnailKeyFor(lost.storageKey));
    await claimedAndAbandoned(lost.id, 1, 10);
    await claimedAndAbandoned(spent.id, 4, 10);
    await claimedAndAbandoned(busy.id, 1, 0);

    await requeueStalledDerivatives(db);

    const made = await until('the lost photo made again', async () => ((await derivativesRow(lost.id)).derivatives_status === 'ready' ? true : null), 60_000, 200);
    expect(made.value).toBe(true);
    expect(await derivativesRow(lost.id)).toMatchObject({ derivatives_attempts: 2, derivatives_error: null });
    expect(await findObject(thumbnailKeyFor(lost.storageKey))).not.toBeNull();

    expect(await derivativesRow(spent.id)).toMatchObject({ derivatives_status: 'failed', derivatives_error: STALLED_DERIVATIVES_MESSAGE });
    // The person sees why, and may make it again.
    const state = await api(`/api/attachments/${spent.id}/derivatives`, { cookie: installer });
    expect(state.body).toMatchObject({ status: 'failed', canMakeAgain: true });

    expect(await derivativesRow(busy.id)).toMatchObject({ derivatives_status: 'making', derivatives_attempts: 1 });
    await db.updateTable('attachments').set({ derivatives_status: 'ready', derivatives_claimed_at: null }).where('id', '=', busy.id).execute();
  });

  it('an impact run whose progress stopped is run again to the end; one whose attempts are spent ends failed', { timeout: 120_000 }, async () => {
    const jurisdiction = await db.selectFrom('jurisdictions').select(['id', 'name']).where('slug', '=', 'demo-county').executeTakeFirstOrThrow();
    const published = (await findPublishedRuleSet(db, jurisdiction.id))!;
    const admin = await db.selectFrom('users').select('id').where('email', '=', 'admin@nookpass.demo').executeTakeFirstOrThrow();
    const abandoned = async (attempts: number) => {
      const run = await insertRuleSetRun(db, { kind: 'impact', jurisdictionId: jurisdiction.id, ruleSetId: published.id, ruleSetVersion: published.version, draftRevision: null, requestedBy: admin.id });
      await db
        .updateTable('rule_set_runs')
        .set({ state: 'running', attempts, claim_token: sql<string>`gen_random_uuid()`, claimed_at: sql<Date>`now() - interval '10 minutes'`, started_at: sql<Date>`now() - interval '10 minutes'`, done_count: 3, total_count: 10 })
        .where('id', '=', run.id)
        .execute();
      return run.id;
    };
    const lost = await abandoned(1);
    const spent = await abandoned(3);

    await requeueStalledRuns(db);

    const { value: done } = await until(
      'the lost run done',
      async () => {
        const row = await db.selectFrom('rule_set_runs').select(['state', 'attempts', 'done_count', 'total_count', 'error']).where('id', '=', lost).executeTakeFirstOrThrow();
        return row.state === 'done' || row.state === 'failed' ? row : null;
      },
      90_000,
      200,
    );
    // Counted afresh from the start under the new claim, to the jurisdiction's whole list.
    expect(done).toMatchObject({ state: 'done', attempts: 2, error: null });
    expect(done.done_count).toBe(done.total_count);
    const shown = await api(`/api/jurisdictions/demo-county/impact-runs/${lost}`, { cookie: await signIn('admin@nookpass.demo') });
    expect(shown.status).toBe(200);
    expect(shown.body).toMatchObject({ state: 'done' });

    const ended = await db.selectFrom('rule_set_runs').select(['state', 'error', 'claim_token']).where('id', '=', spent).executeTakeFirstOrThrow();
    expect(ended).toEqual({ state: 'failed', error: STALLED_RUN_MESSAGE, claim_token: null });
  });
});
