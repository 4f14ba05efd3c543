import { sql } from 'kysely';
import PgBoss from 'pg-boss';
import sharp from 'sharp';
import { extractText, getDocumentProxy } from 'unpdf';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { displayKey, thumbnailKeyFor, withoutMetadataKey } from '@/db/attachments';
import { deleteObject, findObject, putObject } from '@/lib/platform/storage';
import { REPORT_IMAGE_MAX_SIDE_PX, THUMBNAIL_MAX_SIDE_PX } from '@/lib/platform/uploads';
import { longExhaustFailPlan } from '@/tests/fixtures/plans';
import { api, appDatabaseUrl, appDb, baseUrl, postJson, signIn, until, waitForThumbnail } from './helpers';

/*
 * A photo's thumbnail, report-size image and copy without metadata are made by a job after the upload has
 * answered. The sizes checked are the project's own bounds (THUMBNAIL_MAX_SIDE_PX, REPORT_IMAGE_MAX_SIDE_PX in
 * lib/platform/uploads.ts; common practice, no published source), measured on the served images with sharp.
 */

const db = appDb();
let installer: string;
let other: string;
let inspector: string;
let projectId: string;

async function upload(name: string, bytes: Buffer, type: string, caption = '') {
  const form = new FormData();
  form.set('file', new Blob([new Uint8Array(bytes)], { type }), name);
  form.set('caption', caption);
  const res = await fetch(`${baseUrl}/api/projects/${projectId}/attachments`, { method: 'POST', headers: { cookie: installer }, body: form });
  return { status: res.status, body: await res.json() };
}

async function raw(path: string, cookie = installer) {
  const res = await fetch(`${baseUrl}${path}`, { headers: { cookie } });
  return { status: res.status, bytes: Buffer.from(await res.arrayBuffer()) };
}

const storageKeyOf = async (id: string) => (await db.selectFrom('attachments').select('storage_key').where('id', '=', id).executeTakeFirstOrThrow()).storage_key;

/** A JPEG whose header reads but whose pixels stop a third of the way in: the upload takes it, decoding fails. */
async function truncatedJpeg(): Promise<Buffer> {
  const whole = await sharp({ create: { width: 800, height: 600, channels: 3, background: '#808080', noise: { type: 'gaussian', mean: 128, sigma: 40 } } }).jpeg().toBuffer();
  return whole.subarray(0, Math.floor(whole.length / 3));
}

/** Sends jobs straight to the queue, as a duplicated enqueue or a second app server would. */
async function withBoss<T>(fn: (boss: PgBoss) => Promise<T>): Promise<T> {
  const boss = new PgBoss({ connectionString: appDatabaseUrl(), schema: 'pgboss', supervise: false, schedule: false, migrate: false });
  boss.on('error', () => undefined);
  await boss.start();
  try {
    return await fn(boss);
  } finally {
    await boss.stop({ graceful: false, wait: true });
  }
}

async function jobOutputs(ids: string[]): Promise<string[]> {
  const { value } = await until(
    'the jobs finished',
    async () => {
      const rows = (await sql<{ state: string; output: { result?: string } | null }>`SELECT state, output FROM pgboss.job WHERE id = ANY(${ids}::uuid[])`.execute(db)).rows;
      return rows.length === ids.length && rows.every((r) => r.state === 'completed') ? rows.map((r) => r.output?.result ?? '?') : null;
    },
    60_000,
    200,
  );
  return value.sort();
}

beforeAll(async () => {
  [installer, other, inspector] = await Promise.all([signIn('installer@nookpass.demo'), signIn('other-installer@nookpass.demo'), signIn('inspector@nookpass.demo')]);
  const p = await api('/api/projects', postJson({ name: 'IT thumbnails by job (test)', siteAddress: '3 Thumbnail Lane', jurisdiction: 'demo-county' }, { cookie: installer }));
  expect(p.status).toBe(201);
  projectId = p.body.id;
  expect((await api(`/api/projects/${projectId}/plans`, postJson({ plan: longExhaustFailPlan }, { cookie: installer }))).status).toBe(201);
});
afterAll(async () => {
  await db.destroy();
});

describe('photo thumbnails made by a job', () => {
  it('answers the upload before the thumbnail exists, then moves from pending to ready', { timeout: 90_000 }, async () => {
    // 30 MP of one colour: a small file that takes the job a while to decode and re-encode at full size.
    const jpeg = await sharp({ create: { width: 6000, height: 5000, channels: 3, background: '#557799' } }).jpeg().toBuffer();
    const res = await upload('closet-wide.jpg', jpeg, 'image/jpeg', 'Closet, wide view');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.derivatives).toMatchObject({ status: 'pending', attempts: 0 });
    const key = await storageKeyOf(res.body.id);
    expect(await findObject(key)).not.toBeNull();
    // Right after the answer the original is stored and the thumbnail is not; the row says it is on its way.
    expect(await findObject(thumbnailKeyFor(key))).toBeNull();
    const row = await db.selectFrom('attachments').select('derivatives_status').where('id', '=', res.body.id).executeTakeFirstOrThrow();
    expect(['pending', 'making']).toContain(row.derivatives_status);

    const seen = new Set<string>();
    const done = await waitForThumbnail(res.body.id, installer, (s) => (seen.add(s.status), s.status === 'ready' || s.status === 'failed'));
    expect(done).toMatchObject({ status: 'ready', attempts: 1, lastError: null, label: 'ready' });
    expect([...seen].every((s) => ['pending', 'making', 'ready'].includes(s))).toBe(true);
    const list = await api(`/api/projects/${projectId}/attachments`, { cookie: installer });
    expect(list.body.attachments.find((a: { id: string }) => a.id === res.body.id).derivatives.status).toBe('ready');
  });

  it('makes the thumbnail and the report-size image within their bounds, and a copy without metadata', { timeout: 60_000 }, async () => {
    const png = await sharp({ create: { width: 2000, height: 1000, channels: 3, background: '#88aa66' } }).png().toBuffer();
    const res = await upload('dryer-side.png', png, 'image/png', 'Dryer side clearance');
    expect(res.status).toBe(201);
    expect((await waitForThumbnail(res.body.id, installer)).status).toBe('ready');
    const thumb = await raw(`/api/attachments/${res.body.id}?variant=thumb`);
    expect(thumb.status).toBe(200);
    const t = await sharp(thumb.bytes).metadata();
    // 2000 × 1000 fitted inside THUMBNAIL_MAX_SIDE_PX (480): 480 × 240.
    expect([t.format, t.width, t.height]).toEqual(['jpeg', THUMBNAIL_MAX_SIDE_PX, THUMBNAIL_MAX_SIDE_PX / 2]);
    const display = await raw(`/api/attachments/${res.body.id}?variant=display`);
    const d = await sharp(display.bytes).metadata();
    // Fitted inside REPORT_IMAGE_MAX_SIDE_PX (1400): 1400 × 700.
    expect([d.format, d.width, d.height]).toEqual(['jpeg', REPORT_IMAGE_MAX_SIDE_PX, REPORT_IMAGE_MAX_SIDE_PX / 2]);
    const key = await storageKeyOf(res.body.id);
    const stripped = await findObject(withoutMetadataKey(key));
    expect(stripped).not.toBeNull();
    expect((await sharp(stripped!).metadata()).width).toBe(2000);
  });

  it('marks a PDF ready at once: documents get no thumbnail', async () => {
    const res = await upload('permit.pdf', Buffer.concat([Buffer.from('%PDF-1.4\n'), Buffer.alloc(64, 0x20)]), 'application/pdf');
    expect(res.status).toBe(201);
    expect(res.body.derivatives).toMatchObject({ status: 'ready', attempts: 0 });
    const rows = (await sql<{ n: number }>`SELECT count(*)::int AS n FROM pgboss.job WHERE name = 'attachment-derivatives' AND data->>'attachmentId' = ${res.body.id}`.execute(db)).rows;
    expect(rows[0].n).toBe(0);
    expect((await api(`/api/attachments/${res.body.id}`, { method: 'DELETE', cookie: installer })).status).toBe(200);
  });

  it('ends a damaged photo as failed after its retries, refuses the report, and makes it again on request', { timeout: 120_000 }, async () => {
    const res = await upload('damaged.jpg', await truncatedJpeg(), 'image/jpeg', 'Damaged on the way');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const maxAttempts = res.body.derivatives.maxAttempts;
    expect(maxAttempts).toBeGreaterThan(1);
    const failed = await waitForThumbnail(res.body.id, installer, (s) => s.status === 'failed', 90_000);
    expect(failed).toMatchObject({ status: 'failed', attempts: maxAttempts, lastError: 'The image could not be read; it may be damaged.', canMakeAgain: true });
    // The queue retried the one job until its last attempt (pg-boss retry_count counts retries after the first).
    // The last attempt records the failure on the row and ends the job, like an e-mail's last attempt.
    const job = (await sql<{ state: string; retry_count: number; output: unknown }>`SELECT state, retry_count, output FROM pgboss.job WHERE name = 'attachment-derivatives' AND data->>'attachmentId' = ${res.body.id}`.execute(db)).rows;
    expect(job).toEqual([{ state: 'completed', retry_count: maxAttempts - 1, output: { result: 'failed' } }]);
    // Pages show the state instead of the image.
    const thumb = await api(`/api/attachments/${res.body.id}?variant=thumb`, { cookie: installer });
    expect(thumb.status).toBe(409);
    expect(thumb.body.error).toBe(`The thumbnail is not made yet (thumbnail not made after ${maxAttempts} attempts).`);

    // A report must show every photo it lists: this one cannot be, so issuing names it.
    const checkId = (await api(`/api/projects/${projectId}/checks`, postJson({}, { cookie: installer }))).body.id;
    const refused = await api(`/api/checks/${checkId}/report`, { method: 'POST', cookie: installer });
    expect(refused.status).toBe(409);
    expect(refused.body.error).toMatch(/damaged\.jpg could not be read/);

    // Only installers of the company may ask again; others do not learn it exists.
    expect((await api(`/api/attachments/${res.body.id}/derivatives`, { method: 'POST', cookie: other })).status).toBe(404);
    expect((await api(`/api/attachments/${res.body.id}/derivatives`, { method: 'POST', cookie: inspector })).status).toBe(403);
    // The photo is put right in storage (as a repaired store would), then made again on request.
    const key = await storageKeyOf(res.body.id);
    await putObject(key, await sharp({ create: { width: 800, height: 600, channels: 3, background: '#aa7755' } }).jpeg().toBuffer(), 'image/jpeg');
    const again = await api(`/api/attachments/${res.body.id}/derivatives`, { method: 'POST', cookie: installer });
    expect(again.status, JSON.stringify(again.body)).toBe(202);
    expect(again.body).toMatchObject({ status: 'pending', attempts: 0, canMakeAgain: false });
    expect((await waitForThumbnail(res.body.id, installer)).status).toBe('ready');
    const t = await sharp((await raw(`/api/attachments/${res.body.id}?variant=thumb`)).bytes).metadata();
    expect(Math.max(t.width!, t.height!)).toBe(THUMBNAIL_MAX_SIDE_PX);
    const twice = await api(`/api/attachments/${res.body.id}/derivatives`, { method: 'POST', cookie: installer });
    expect(twice.status).toBe(409);
    expect(twice.body.error).toMatch(/already made/);
    expect((await api(`/api/attachments/${res.body.id}`, { method: 'DELETE', cookie: installer })).status).toBe(200);
  });

  it('stores a photo’s images once when its job runs twice', { timeout: 90_000 }, async () => {
    const png = await sharp({ create: { width: 1200, height: 900, channels: 3, background: '#336655' } }).png().toBuffer();
    const res = await upload('twice.png', png, 'image/png');
    expect((await waitForThumbnail(res.body.id, installer)).status).toBe('ready');
    const key = await storageKeyOf(res.body.id);

    // Done already: two more jobs for it (a duplicated enqueue, a second server) find nothing to claim and store nothing.
    await deleteObject(thumbnailKeyFor(key));
    const late = await withBoss(async (boss) => [await boss.send('attachment-derivatives', { attachmentId: res.body.id }), await boss.send('attachment-derivatives', { attachmentId: res.body.id })]);
    expect(await jobOutputs(late as string[])).toEqual(['not-claimed', 'not-claimed']);
    expect(await findObject(thumbnailKeyFor(key))).toBeNull();

    // Waiting again with two jobs at once: one makes and stores the images, the other finds it claimed or done.
    await db.updateTable('attachments').set({ derivatives_status: 'pending', derivatives_attempts: 0 }).where('id', '=', res.body.id).execute();
    const both = await withBoss(async (boss) => Promise.all([boss.send('attachment-derivatives', { attachmentId: res.body.id }), boss.send('attachment-derivatives', { attachmentId: res.body.id })]));
    expect(await jobOutputs(both as string[])).toEqual(['made', 'not-claimed']);
    const row = await db.selectFrom('attachments').select(['derivatives_status', 'derivatives_attempts']).where('id', '=', res.body.id).executeTakeFirstOrThrow();
    expect(row).toEqual({ derivatives_status: 'ready', derivatives_attempts: 1 });
    for (const k of [thumbnailKeyFor(key), displayKey(key), withoutMetadataKey(key)]) expect(await findObject(k), k).not.toBeNull();
  });

  it('puts a photo whose images are not made yet into the report, made from the original', { timeout: 90_000 }, async () => {
    const jpeg = await sharp({ create: { width: 1600, height: 1200, channels: 3, background: '#775533' } }).jpeg().toBuffer();
    const res = await upload('pending-nameplate.jpg', jpeg, 'image/jpeg', 'Nameplate not yet thumbnailed');
    expect(res.status).toBe(201);
    // As if the job had not made it: once the worker is done with it, the row is held back and the image removed.
    await waitForThumbnail(res.body.id, installer);
    await db.updateTable('attachments').set({ derivatives_status: 'failed', derivatives_error: 'held back by the test' }).where('id', '=', res.body.id).execute();
    const key = await storageKeyOf(res.body.id);
    await deleteObject(displayKey(key));
    const checkId = (await api(`/api/projects/${projectId}/checks`, postJson({}, { cookie: installer }))).body.id;
    const report = await fetch(`${baseUrl}/api/checks/${checkId}/report`, { method: 'POST', headers: { cookie: installer } });
    expect(report.status).toBe(200);
    const pdf = Buffer.from(await report.arrayBuffer());
    const { text } = await extractText(await getDocumentProxy(new Uint8Array(pdf)), { mergePages: true });
    expect(text).toContain('Nameplate not yet thumbnailed');
    expect(text).toContain('Closet, wide view');
    // Made for this report only; the job stores its own.
    expect(await findObject(displayKey(key))).toBeNull();
  });
});
