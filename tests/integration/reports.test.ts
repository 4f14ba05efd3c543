import { request as httpRequest } from 'node:http';
import bcrypt from 'bcryptjs';
import { parse as parseContentDisposition } from 'content-disposition';
import sharp from 'sharp';
import { extractText, getDocumentProxy } from 'unpdf';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { withoutMetadataKey } from '@/db/attachments';
import { deleteObject, findObject } from '@/lib/platform/storage';
import { longExhaustFailPlan } from '@/tests/fixtures/plans';
import { api, appDb, baseUrl, deactivateTestPeople, postJson, signIn, waitForMail, waitForMailState, waitForThumbnail } from './helpers';

const db = appDb();
let installer: string;
let other: string;
let inspector: string;
let cityInspector: string;
const cityInspectorEmail = `city-inspector-${Date.now()}@example.test`;
let projectId: string;
let checkId: string;

async function raw(path: string, cookie?: string, method = 'GET') {
  const res = await fetch(`${baseUrl}${path}`, { method, headers: cookie ? { cookie } : {} });
  return { status: res.status, headers: res.headers, bytes: Buffer.from(await res.arrayBuffer()) };
}

async function upload(cookie: string, name: string, bytes: Buffer, type = 'application/octet-stream', caption = '') {
  const form = new FormData();
  form.set('file', new Blob([new Uint8Array(bytes)], { type }), name);
  form.set('caption', caption);
  const res = await fetch(`${baseUrl}/api/projects/${projectId}/attachments`, { method: 'POST', headers: { cookie }, body: form });
  return { status: res.status, body: await res.json() };
}

/**
 * An upload the server may refuse before it has read it all. The server answers 413 as soon as the file passes
 * its limit and stops reading (RFC 9110 §15.5.14 lets it close the connection); fetch then reports the socket
 * closing under its unfinished write and drops the answer, so this client takes the answer whenever it comes
 * and ignores the write error that follows it.
 */
async function uploadMayBeRefusedEarly(cookie: string, name: string, bytes: Buffer, type: string): Promise<number> {
  const form = new FormData();
  form.set('file', new Blob([new Uint8Array(bytes)], { type }), name);
  const encoded = new Response(form);
  const body = Buffer.from(await encoded.arrayBuffer());
  return new Promise<number>((resolve, reject) => {
    let answered = false;
    const req = httpRequest(new URL(`/api/projects/${projectId}/attachments`, baseUrl), {
      method: 'POST',
      headers: { cookie, 'content-type': encoded.headers.get('content-type') ?? '', 'content-length': String(body.length) },
    }, (res) => {
      answered = true;
      res.resume();
      resolve(res.statusCode ?? 0);
      req.destroy();
    });
    req.on('error', (err) => (answered ? undefined : reject(err)));
    req.end(body);
  });
}

async function countAttachments() {
  const r = await db.selectFrom('attachments').select(db.fn.countAll<number>().as('n')).where('project_id', '=', projectId).executeTakeFirstOrThrow();
  return Number(r.n);
}

beforeAll(async () => {
  const city = await db.selectFrom('jurisdictions').select('id').where('slug', '=', 'demo-city').executeTakeFirstOrThrow();
  const email = cityInspectorEmail;
  await db.insertInto('users').values({ email, name: 'City Test Inspector', role: 'inspector', jurisdiction_id: city.id, password_hash: await bcrypt.hash('city-inspector-pw', 4) }).execute();
  [installer, other, inspector, cityInspector] = await Promise.all([
    signIn('installer@nookpass.demo'),
    signIn('other-installer@nookpass.demo'),
    signIn('inspector@nookpass.demo'),
    signIn(email, 'city-inspector-pw'),
  ]);
  const p = await api('/api/projects', postJson({ name: 'IT report project <i>x</i>', siteAddress: '9 Report Road', jurisdiction: 'demo-county' }, { cookie: installer }));
  projectId = p.body.id;
  await api(`/api/projects/${projectId}/plans`, postJson({ plan: longExhaustFailPlan }, { cookie: installer }));
  checkId = (await api(`/api/projects/${projectId}/checks`, postJson({}, { cookie: installer }))).body.id;
});
afterAll(async () => {
  await deactivateTestPeople(db, cityInspectorEmail);
  await db.destroy();
});

describe('uploads', () => {
  it('accepts a real photo, makes a thumbnail and keeps the caption', async () => {
    const jpeg = await sharp({ create: { width: 1600, height: 1200, channels: 3, background: '#7799bb' } }).jpeg().toBuffer();
    const res = await upload(installer, 'nameplate.jpg', jpeg, 'image/jpeg', 'Dryer nameplate');
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ kind: 'photo', contentType: 'image/jpeg', width: 1600, height: 1200, caption: 'Dryer nameplate' });
    // The thumbnail is made by a job after the upload has answered.
    expect((await waitForThumbnail(res.body.id, installer)).status).toBe('ready');
    const thumb = await raw(`/api/attachments/${res.body.id}?variant=thumb`, installer);
    expect(thumb.status).toBe(200);
    const meta = await sharp(thumb.bytes).metadata();
    expect(Math.max(meta.width!, meta.height!)).toBe(480);
    const orig = await raw(`/api/attachments/${res.body.id}`, installer);
    expect(orig.bytes.equals(jpeg)).toBe(true);
  });

  it('refuses a wrong type, a spoofed extension, too many bytes and a decompression bomb, leaving nothing behind', async () => {
    const before = await countAttachments();
    const text = await upload(installer, 'photo.jpg', Buffer.from('just some text, not an image at all'), 'image/jpeg');
    expect(text.status).toBe(400);
    expect(text.body.errors[0]).toMatchObject({ path: 'file' });
    const png = await sharp({ create: { width: 10, height: 10, channels: 3, background: '#000' } }).png().toBuffer();
    const spoofed = await upload(installer, 'permit.pdf', png, 'application/pdf');
    expect(spoofed.status).toBe(400);
    expect(spoofed.body.errors[0].message).toMatch(/is a PNG but is named \.pdf/);
    const big = await upload(installer, 'big.pdf', Buffer.concat([Buffer.from('%PDF-1.4\n'), Buffer.alloc(16 * 1024 * 1024, 0x20)]), 'application/pdf');
    expect(big.status).toBe(413);
    // 10 000 × 10 000 px = 100 MP of one colour compresses to a small file; it must not be decoded.
    const bomb = await sharp({ create: { width: 10000, height: 10000, channels: 3, background: '#000' } }).png({ compressionLevel: 9 }).toBuffer();
    expect(bomb.length).toBeLessThan(2 * 1024 * 1024);
    const bombRes = await upload(installer, 'bomb.png', bomb, 'image/png');
    expect(bombRes.status).toBe(400);
    expect(bombRes.body.errors[0].message).toMatch(/megapixels/);
    expect(await countAttachments()).toBe(before);
  });

  it('accepts a file of exactly 15 MB and refuses one byte more, extra files and unknown fields, naming the part', { timeout: 60_000 }, async () => {
    const MAX = 15 * 1024 * 1024; // lib/uploads.ts MAX_UPLOAD_BYTES
    const pdfOf = (size: number) => Buffer.concat([Buffer.from('%PDF-1.4\n'), Buffer.alloc(size - 9, 0x20)]);
    const atLimit = await upload(installer, 'at-limit.pdf', pdfOf(MAX), 'application/pdf');
    expect(atLimit.status, JSON.stringify(atLimit.body)).toBe(201);
    expect(atLimit.body.byteSize).toBe(MAX);
    expect((await api(`/api/attachments/${atLimit.body.id}`, { method: 'DELETE', cookie: installer })).status).toBe(200);
    expect(await uploadMayBeRefusedEarly(installer, 'over.pdf', pdfOf(MAX + 1), 'application/pdf')).toBe(413);

    const before = await countAttachments();
    const png = await sharp({ create: { width: 8, height: 8, channels: 3, background: '#123456' } }).png().toBuffer();
    const post = async (form: FormData) => {
      const res = await fetch(`${baseUrl}/api/projects/${projectId}/attachments`, { method: 'POST', headers: { cookie: installer }, body: form });
      return { status: res.status, body: await res.json() };
    };
    const two = new FormData();
    two.append('file', new Blob([new Uint8Array(png)], { type: 'image/png' }), 'a.png');
    two.append('file', new Blob([new Uint8Array(png)], { type: 'image/png' }), 'b.png');
    expect((await post(two)).status).toBe(400);
    const extra = new FormData();
    extra.set('file', new Blob([new Uint8Array(png)], { type: 'image/png' }), 'a.png');
    extra.set('owner', 'someone else');
    const extraRes = await post(extra);
    expect(extraRes.status).toBe(400);
    expect(extraRes.body.errors[0].path).toBe('owner');
    const long = await upload(installer, 'a.png', png, 'image/png', 'x'.repeat(301));
    expect(long.status).toBe(400);
    expect(long.body.errors[0].path).toBe('caption');
    expect(await countAttachments()).toBe(before);
  });

  it('strips folders from the file name', async () => {
    const png = await sharp({ create: { width: 20, height: 20, channels: 3, background: '#fff' } }).png().toBuffer();
    const res = await upload(installer, '../../etc/passwd.png', png, 'image/png');
    expect(res.status).toBe(201);
    expect(res.body.filename).toBe('passwd.png');
    const del = await api(`/api/attachments/${res.body.id}`, { method: 'DELETE', cookie: installer });
    expect(del.status).toBe(200);
    expect((await raw(`/api/attachments/${res.body.id}`, installer)).status).toBe(404);
  });

  it('takes and serves a file named outside Latin-1, with its thumbnail', async () => {
    const name = 'фото-😀.png';
    const png = await sharp({ create: { width: 40, height: 30, channels: 3, background: '#88aa66' } }).png().toBuffer();
    const res = await upload(installer, name, png, 'image/png');
    expect(res.status).toBe(201);
    expect(res.body.filename).toBe(name);
    const orig = await raw(`/api/attachments/${res.body.id}`, installer);
    expect(orig.status).toBe(200);
    expect(orig.bytes.equals(png)).toBe(true);
    // RFC 6266 §4.3 / RFC 8187: filename* carries the UTF-8 name, filename a plain fallback.
    const header = orig.headers.get('content-disposition')!;
    expect(header).toContain(`filename*=UTF-8''${encodeURIComponent('фото-')}`);
    const parsed = parseContentDisposition(header);
    expect(parsed.type).toBe('inline');
    expect(parsed.parameters.filename).toBe(name); // the package prefers filename* when both are there
    expect((await waitForThumbnail(res.body.id, installer)).status).toBe('ready');
    const thumb = await raw(`/api/attachments/${res.body.id}?variant=thumb`, installer);
    expect(thumb.status).toBe(200);
    expect(parseContentDisposition(thumb.headers.get('content-disposition')!).parameters.filename).toBe('фото-😀.jpg');
    expect((await sharp(thumb.bytes).metadata()).format).toBe('jpeg');
  });

  it('keeps files away from another company', async () => {
    const list = await api(`/api/projects/${projectId}/attachments`, { cookie: installer });
    const id = list.body.attachments[0].id;
    expect((await raw(`/api/attachments/${id}`, other)).status).toBe(404);
    expect((await api(`/api/projects/${projectId}/attachments`, { cookie: other })).status).toBe(404);
    expect((await api(`/api/attachments/${id}`, postJson({ caption: 'mine now' }, { cookie: other, method: 'PATCH' }))).status).toBe(404);
    // Not sent to any jurisdiction yet, so no inspector can read it either.
    expect((await raw(`/api/attachments/${id}`, inspector)).status).toBe(404);
  });
});

describe('report download and verification', () => {
  let code: string;
  let pdf: Buffer;

  it('downloads a PDF with a meaningful name that cites the checked sections and records code, hash and author', async () => {
    const res = await raw(`/api/checks/${checkId}/report`, installer, 'POST');
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('application/pdf');
    code = res.headers.get('x-report-code')!;
    const disposition = parseContentDisposition(res.headers.get('content-disposition')!);
    expect(disposition).toMatchObject({ type: 'attachment', parameters: { filename: `nookpass-it-report-project-ixi-${code}.pdf` } });
    pdf = res.bytes;
    const doc = await getDocumentProxy(new Uint8Array(pdf));
    const { text } = await extractText(doc, { mergePages: true });
    const flat = text.replace(/\s+/g, ' ');
    // IRC 2018 M1502.4.5.1 (35 ft) and IMC 2018 504.6 (100 sq in closet opening) with the plan's measured values.
    expect(flat).toContain('IRC 2018 M1502.4.5.1');
    expect(flat).toContain(`45' 6"`);
    expect(flat).toContain('IMC 2018 504.6');
    expect(flat).toContain('40 sq in');
    expect(flat).toContain(`NookPass report ${code}`);
    expect(flat).toContain('Dryer nameplate');
    const row = await db.selectFrom('reports').selectAll().where('code', '=', code).executeTakeFirstOrThrow();
    expect(row.sha256).toBe(res.headers.get('x-report-sha256'));
    expect(row.byte_size).toBe(pdf.length);
    const author = await db.selectFrom('users').select('email').where('id', '=', row.created_by!).executeTakeFirstOrThrow();
    expect(author.email).toBe('installer@nookpass.demo');
  });

  it('refuses to issue a report from a cross-site link', async () => {
    const before = await db.selectFrom('reports').select(db.fn.countAll<number>().as('n')).executeTakeFirstOrThrow();
    const res = await fetch(`${baseUrl}/api/checks/${checkId}/report`, { method: 'POST', headers: { cookie: installer, 'sec-fetch-site': 'cross-site' } });
    expect(res.status).toBe(403);
    const after = await db.selectFrom('reports').select(db.fn.countAll<number>().as('n')).executeTakeFirstOrThrow();
    expect(Number(after.n)).toBe(Number(before.n));
  });

  it('accepts the issued file and rejects an altered one', async () => {
    const facts = await api(`/api/reports/${code}`);
    expect(facts.status).toBe(200);
    expect(facts.body).toMatchObject({ code, projectName: 'IT report project <i>x</i>', ruleSetVersion: 1 });
    expect(Object.keys(facts.body).sort()).toEqual(['asIssued', 'checkedAt', 'code', 'issuedAt', 'jurisdiction', 'pageCount', 'projectName', 'ruleSetVersion', 'sha256', 'siteAddress', 'summary'].sort());
    const verify = (body: Buffer) => fetch(`${baseUrl}/api/reports/${code}/verify`, { method: 'POST', body: new Uint8Array(body) }).then((r) => r.json());
    expect((await verify(pdf)).genuine).toBe(true);
    const altered = Buffer.from(pdf);
    altered[Math.floor(altered.length / 2)] ^= 0x01;
    expect((await verify(altered)).genuine).toBe(false);
    expect((await api('/api/reports/NP-NONE-NONE')).status).toBe(404);
    const page = await fetch(`${baseUrl}/verify/${code}`);
    expect(page.status).toBe(200);
    const html = await page.text();
    expect(html).toContain(facts.body.sha256);
    expect(html).not.toContain('<i>x</i>'); // markup shown escaped
  });

  it('lets only the company, admins and the receiving jurisdiction download the stored PDF', async () => {
    expect((await raw(`/api/reports/${code}/pdf`, installer)).bytes.equals(pdf)).toBe(true);
    expect((await raw(`/api/reports/${code}/pdf`, other)).status).toBe(404);
    expect((await raw(`/api/reports/${code}/pdf`, inspector)).status).toBe(404); // not sent yet
    expect((await raw(`/api/reports/${code}/pdf`)).status).toBe(401);
  });
});

describe('sending to the inspector and the review', () => {
  let reportId: string;
  let code: string;

  it('mails the report with the PDF attached and the verification link', async () => {
    const res = await api(`/api/checks/${checkId}/send`, postJson({ note: 'Ready for rough-in.', confirmFailingFindings: true }, { cookie: installer }));
    expect(res.status).toBe(201);
    expect(res.body.to).toBe('inspector@nookpass.demo');
    code = res.body.report.code;
    reportId = (await db.selectFrom('reports').select('id').where('code', '=', code).executeTakeFirstOrThrow()).id;
    // Answered at once with the e-mail queued; a job delivers it, once.
    expect(res.body.mail.status).toBe('queued');
    const [mail] = await waitForMail((m) => m.subject.includes(code));
    expect(mail.to).toContain('inspector@nookpass.demo');
    expect(mail.text).toContain(`/verify/${code}`);
    expect(mail.text).toContain('Ready for rough-in.');
    expect(mail.attachments).toEqual([expect.objectContaining({ contentType: 'application/pdf', filename: expect.stringContaining(code) })]);
    const send = await db.selectFrom('report_sends').selectAll().where('report_id', '=', reportId).executeTakeFirstOrThrow();
    expect(send.status).toBe('sent');
  });

  it('records a refused address on the e-mail without retrying, and keeps the check and the report', async () => {
    const before = await db.selectFrom('reports').select(db.fn.countAll<number>().as('n')).executeTakeFirstOrThrow();
    const res = await api(`/api/checks/${checkId}/send`, postJson({ to: 'nobody@mailbox.invalid', confirm: true, confirmFailingFindings: true }, { cookie: installer }));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    // The relay refuses the address with a 5xx (RFC 5321 §4.2.1: permanent): one attempt, then "failed" with its words.
    const state = await waitForMailState(res.body.mail.id, installer, (m) => m.status === 'failed');
    expect(state.attempts).toBe(1);
    expect(state.lastError).toContain('refused nobody@mailbox.invalid');
    expect(state.label).toBe('not sent after 1 attempt');
    const after = await db.selectFrom('reports').select(db.fn.countAll<number>().as('n')).executeTakeFirstOrThrow();
    expect(Number(after.n)).toBe(Number(before.n) + 1); // the report was issued and stays on record
    expect((await api(`/api/checks/${checkId}`, { cookie: installer })).status).toBe(200);
    // Not shown to any inspector: it was not sent to the inspector address.
    const list = await api(`/api/inspections?q=${res.body.report.code}`, { cookie: inspector });
    expect(list.body.inspections.map((i: { code: string }) => i.code)).not.toContain(res.body.report.code);
  });

  it('shows the report to the inspector of the jurisdiction and to no other inspector', async () => {
    const mine = await api(`/api/inspections?q=${code}`, { cookie: inspector });
    expect(mine.body.inspections.map((i: { code: string }) => i.code)).toContain(code);
    const theirs = await api(`/api/inspections?q=${code}`, { cookie: cityInspector });
    expect(theirs.body.inspections.map((i: { code: string }) => i.code)).not.toContain(code);
    expect((await api(`/api/inspections/${reportId}`, { cookie: cityInspector })).status).toBe(404);
    expect((await raw(`/api/reports/${code}/pdf`, cityInspector)).status).toBe(404);
    expect((await api(`/api/inspections/${reportId}/review`, postJson({ outcome: 'approved' }, { cookie: cityInspector }))).status).toBe(404);
    const detail = await api(`/api/inspections/${reportId}`, { cookie: inspector });
    expect(detail.status).toBe(200);
    expect(detail.body.attachments.length).toBeGreaterThan(0);
    // The inspector can now see the photos the report included, and where their thumbnails are.
    expect((await waitForThumbnail(detail.body.attachments[0].id, inspector)).status).toBe('ready');
    expect((await raw(`/api/attachments/${detail.body.attachments[0].id}?variant=thumb`, inspector)).status).toBe(200);
    expect((await api('/api/inspections', { cookie: installer })).status).toBe(403);
  });

  it('records the outcome, e-mails the installer and shows it on the project', async () => {
    const bad = await api(`/api/inspections/${reportId}/review`, postJson({ outcome: 'corrections-needed' }, { cookie: inspector }));
    expect(bad.status).toBe(400);
    expect(bad.body.errors[0].path).toBe('comment');
    const unknownKey = await api(`/api/inspections/${reportId}/review`, postJson({ outcome: 'approved', findingComments: { 'exhaust.nonsense': 'x' } }, { cookie: inspector }));
    expect(unknownKey.status).toBe(400);
    const ok = await api(
      `/api/inspections/${reportId}/review`,
      postJson({ outcome: 'corrections-needed', comment: 'Shorten the run.', findingComments: { 'exhaust.developed-length': 'Over 35 ft.' } }, { cookie: inspector }),
    );
    expect(ok.status).toBe(201);
    expect(ok.body.mailed).toBe(1);
    const [mail] = await waitForMail((m) => m.to.includes('installer@nookpass.demo') && m.subject.includes('corrections needed') && m.text.includes(code));
    expect(mail.text).toContain('Shorten the run.');
    const page = await fetch(`${baseUrl}/projects/${projectId}`, { headers: { cookie: installer } });
    expect(await page.text()).toContain('Corrections needed');
    await expect(db.updateTable('inspection_reviews').set({ outcome: 'approved' }).where('report_id', '=', reportId).execute()).rejects.toThrow(/append-only/);
  });
});

describe('photos seen outside the company', () => {
  it('serves the original to the company with its GPS position and to the inspector without any metadata', { timeout: 60_000 }, async () => {
    // EXIF 2.32: GPS data sits in the GPS IFD, reached through tag 34853 (0x8825) of IFD0.
    const gpsPointer = Buffer.from([0x25, 0x88]); // little-endian ("II"), as sharp writes it
    const jpeg = await sharp({ create: { width: 320, height: 240, channels: 3, background: '#5577aa' } })
      .withExif({ IFD0: { ImageDescription: 'test photo' }, IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '51/1 30/1 1234/100', GPSLongitudeRef: 'W', GPSLongitude: '0/1 7/1 500/100' } })
      .jpeg()
      .toBuffer();
    const source = await sharp(jpeg).metadata();
    expect(source.exif?.includes(gpsPointer)).toBe(true);
    const res = await upload(installer, 'site-with-position.jpg', jpeg, 'image/jpeg', 'Photo with a GPS position');
    expect(res.status).toBe(201);
    expect((await waitForThumbnail(res.body.id, installer)).status).toBe('ready');
    const sent = await api(`/api/checks/${checkId}/send`, postJson({ confirmFailingFindings: true }, { cookie: installer }));
    expect(sent.status).toBe(201);

    const own = await raw(`/api/attachments/${res.body.id}`, installer);
    expect(own.bytes.equals(jpeg)).toBe(true);
    const theirs = await raw(`/api/attachments/${res.body.id}`, inspector);
    expect(theirs.status).toBe(200);
    expect(theirs.headers.get('content-type')).toBe('image/jpeg');
    const meta = await sharp(theirs.bytes).metadata();
    expect(meta.exif).toBeUndefined();
    expect(meta.xmp).toBeUndefined();
    expect([meta.width, meta.height]).toEqual([320, 240]);
    expect(theirs.bytes.includes(Buffer.from('Exif\0\0', 'latin1'))).toBe(false); // no APP1 EXIF segment (JFIF/EXIF 2.32 §4.5.4)
    for (const variant of ['thumb', 'display']) {
      expect((await sharp((await raw(`/api/attachments/${res.body.id}?variant=${variant}`, inspector)).bytes).metadata()).exif, variant).toBeUndefined();
    }

    // A photo uploaded before copies without metadata were kept gets one made the first time it is served.
    const row = await db.selectFrom('attachments').select('storage_key').where('id', '=', res.body.id).executeTakeFirstOrThrow();
    await deleteObject(withoutMetadataKey(row.storage_key));
    expect(await findObject(withoutMetadataKey(row.storage_key))).toBeNull();
    const remade = await raw(`/api/attachments/${res.body.id}`, inspector);
    expect(remade.status).toBe(200);
    expect((await sharp(remade.bytes).metadata()).exif).toBeUndefined();
    expect((await findObject(withoutMetadataKey(row.storage_key)))?.equals(remade.bytes)).toBe(true);
  });
});
