// A local stand-in for an S3 bucket: path-style PUT/GET/HEAD/DELETE of objects and ListObjectsV2 on loopback, kept as
// files. The app talks to it with the real AWS SDK, so a hosted bucket is only a change of endpoint.
import { createHash } from 'node:crypto';
import { promises as fs } from 'node:fs';
import http from 'node:http';
import path from 'node:path';

export type FakeS3Options = { port: number; dir: string; host?: string; accessKeyId?: string };

const MAX_OBJECT_BYTES = 64 * 1024 * 1024;

function xmlError(res: http.ServerResponse, status: number, code: string, message: string) {
  res.writeHead(status, { 'content-type': 'application/xml' });
  res.end(`<?xml version="1.0" encoding="UTF-8"?><Error><Code>${code}</Code><Message>${message}</Message></Error>`);
}

/** Keys may contain slashes; anything that would climb out of the bucket folder is refused. */
function objectPath(root: string, bucket: string, key: string): string | null {
  if (!/^[a-z0-9][a-z0-9.-]{1,62}$/.test(bucket)) return null;
  const base = path.join(root, bucket);
  const file = path.normalize(path.join(base, 'objects', key));
  return file.startsWith(path.join(base, 'objects') + path.sep) ? file : null;
}

export async function startFakeS3(opts: FakeS3Options): Promise<{ close: () => Promise<void> }> {
  const host = opts.host ?? '127.0.0.1';
  await fs.mkdir(opts.dir, { recursive: true });
  const server = http.createServer(async (req, res) => {
    try {
      // Only the configured access key may use the bucket (the signature itself is not checked here).
      const auth = req.headers.authorization ?? '';
      if (opts.accessKeyId && !auth.includes(`Credential=${opts.accessKeyId}/`)) {
        return xmlError(res, 403, 'InvalidAccessKeyId', 'Unknown access key');
      }
      const url = new URL(req.url ?? '/', `http://${host}`);
      const [, bucket, ...rest] = url.pathname.split('/');
      const key = decodeURIComponent(rest.join('/'));
      if (!bucket) return xmlError(res, 400, 'InvalidRequest', 'Path-style bucket required');
      const bucketDir = path.join(opts.dir, bucket);
      if (!key) {
        if (req.method === 'PUT') {
          await fs.mkdir(path.join(bucketDir, 'objects'), { recursive: true });
          res.writeHead(200).end();
          return;
        }
        if (req.method === 'HEAD') {
          const ok = await fs.stat(bucketDir).then(() => true, () => false);
          res.writeHead(ok ? 200 : 404).end();
          return;
        }
        if (req.method === 'GET' && url.searchParams.get('list-type') === '2') {
          return listObjects(res, bucket, bucketDir, url.searchParams);
        }
        return xmlError(res, 405, 'MethodNotAllowed', 'Only object operations and ListObjectsV2 are supported');
      }
      const file = objectPath(opts.dir, bucket, key);
      if (!file) return xmlError(res, 400, 'InvalidObjectName', 'Object key not allowed');
      if (!(await fs.stat(bucketDir).then(() => true, () => false))) return xmlError(res, 404, 'NoSuchBucket', 'No such bucket');

      if (req.method === 'PUT') {
        const chunks: Buffer[] = [];
        let size = 0;
        for await (const chunk of req) {
          size += (chunk as Buffer).length;
          if (size > MAX_OBJECT_BYTES) return xmlError(res, 400, 'EntityTooLarge', 'Object too large');
          chunks.push(chunk as Buffer);
        }
        let body: Buffer = Buffer.concat(chunks);
        // The SDK may send aws-chunked bodies; unwrap "size;chunk-signature=...\r\n data \r\n" frames.
        if (String(req.headers['content-encoding'] ?? '').includes('aws-chunked') || req.headers['x-amz-decoded-content-length']) {
          body = decodeAwsChunked(body);
        }
        await fs.mkdir(path.dirname(file), { recursive: true });
        const tmp = `${file}.${process.pid}.${Date.now()}.tmp`;
        await fs.writeFile(tmp, body);
        await fs.writeFile(`${file}.meta.json`, JSON.stringify({ contentType: req.headers['content-type'] ?? 'application/octet-stream' }));
        await fs.rename(tmp, file);
        const etag = createHash('md5').update(body).digest('hex');
        res.writeHead(200, { etag: `"${etag}"` }).end();
        return;
      }
      if (req.method === 'GET' || req.method === 'HEAD') {
        const data = await fs.readFile(file).catch(() => null);
        if (!data) return xmlError(res, 404, 'NoSuchKey', 'The specified key does not exist.');
        const meta = JSON.parse(await fs.readFile(`${file}.meta.json`, 'utf8').catch(() => '{}'));
        res.writeHead(200, {
          'content-type': meta.contentType ?? 'application/octet-stream',
          'content-length': data.length,
          etag: `"${createHash('md5').update(data).digest('hex')}"`,
        });
        res.end(req.method === 'GET' ? data : undefined);
        return;
      }
      if (req.method === 'DELETE') {
        await fs.rm(file, { force: true });
        await fs.rm(`${file}.meta.json`, { force: true });
        res.writeHead(204).end();
        return;
      }
      xmlError(res, 405, 'MethodNotAllowed', 'Method not allowed');
    } catch (err) {
      xmlError(res, 500, 'InternalError', String((err as Error).message));
    }
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port, host, () => resolve());
  });
  return { close: () => new Promise<void>((resolve) => server.close(() => resolve())) };
}

const xmlText = (t: string) => t.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');

/** ListObjectsV2: keys in order, at most max-keys (1,000) a page, the next page after the continuation token. */
async function listObjects(res: http.ServerResponse, bucket: string, bucketDir: string, q: URLSearchParams) {
  const root = path.join(bucketDir, 'objects');
  const keys: { key: string; size: number; modified: Date }[] = [];
  async function walk(dir: string) {
    for (const entry of await fs.readdir(dir, { withFileTypes: true }).catch(() => [])) {
      const full = path.join(dir, entry.name);
      if (entry.isDirectory()) await walk(full);
      else if (!entry.name.endsWith('.meta.json') && !entry.name.endsWith('.tmp')) {
        const st = await fs.stat(full);
        keys.push({ key: path.relative(root, full).split(path.sep).join('/'), size: st.size, modified: st.mtime });
      }
    }
  }
  await walk(root);
  const prefix = q.get('prefix') ?? '';
  const after = q.get('continuation-token') ? Buffer.from(q.get('continuation-token')!, 'base64url').toString('utf8') : (q.get('start-after') ?? '');
  const maxKeys = Math.min(1000, Number(q.get('max-keys') ?? 1000) || 1000);
  const matching = keys.filter((k) => k.key.startsWith(prefix) && k.key > after).sort((a, b) => (a.key < b.key ? -1 : 1));
  const page = matching.slice(0, maxKeys);
  const truncated = matching.length > page.length;
  res.writeHead(200, { 'content-type': 'application/xml' });
  res.end(
    `<?xml version="1.0" encoding="UTF-8"?><ListBucketResult xmlns="http://s3.amazonaws.com/doc/2006-03-01/">` +
      `<Name>${xmlText(bucket)}</Name><Prefix>${xmlText(prefix)}</Prefix><KeyCount>${page.length}</KeyCount><MaxKeys>${maxKeys}</MaxKeys>` +
      `<IsTruncated>${truncated}</IsTruncated>` +
      page.map((k) => `<Contents><Key>${xmlText(k.key)}</Key><LastModified>${k.modified.toISOString()}</LastModified><Size>${k.size}</Size><StorageClass>STANDARD</StorageClass></Contents>`).join('') +
      (truncated ? `<NextContinuationToken>${Buffer.from(page.at(-1)!.key).toString('base64url')}</NextContinuationToken>` : '') +
      `</ListBucketResult>`,
  );
}

function decodeAwsChunked(body: Buffer): Buffer {
  const out: Buffer[] = [];
  let i = 0;
  while (i < body.length) {
    const lineEnd = body.indexOf('\r\n', i);
    if (lineEnd < 0) break;
    const size = parseInt(body.subarray(i, lineEnd).toString('ascii').split(';')[0], 16);
    if (!Number.isFinite(size) || size === 0) break;
    out.push(body.subarray(lineEnd + 2, lineEnd + 2 + size));
    i = lineEnd + 2 + size + 2;
  }
  return Buffer.concat(out);
}

if (process.argv[1] && /fake-s3\.ts$/.test(process.argv[1])) {
  const port = Number(process.env.NOOKPASS_S3_PORT ?? 54327);
  const dir = process.env.NOOKPASS_S3_DIR ?? path.join(process.cwd(), '.data', 's3');
  startFakeS3({ port, dir, accessKeyId: process.env.NOOKPASS_S3_ACCESS_KEY ?? 'nookpass-local' })
    .then(() => console.log(`[fake-s3] S3 endpoint on http://127.0.0.1:${port}`))
    .catch((err) => {
      console.error('[fake-s3]', err.message);
      process.exit(1);
    });
}
