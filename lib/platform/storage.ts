import 'server-only';
import { CreateBucketCommand, DeleteObjectCommand, GetObjectCommand, HeadBucketCommand, ListObjectsV2Command, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import { ServiceUnavailableError } from '@/lib/domain/errors';
import { log } from '@/lib/platform/log';

// Endpoint, bucket and keys from the environment: the local fake by default, a hosted bucket in production.
export function storageConfig() {
  return {
    endpoint: process.env.NOOKPASS_S3_ENDPOINT ?? `http://127.0.0.1:${process.env.NOOKPASS_S3_PORT ?? 54327}`,
    bucket: process.env.NOOKPASS_S3_BUCKET ?? 'nookpass-local',
    region: process.env.NOOKPASS_S3_REGION ?? 'us-east-1',
    accessKeyId: process.env.NOOKPASS_S3_ACCESS_KEY ?? 'nookpass-local',
    secretAccessKey: process.env.NOOKPASS_S3_SECRET ?? 'nookpass-local-secret',
  };
}

const g = globalThis as unknown as { nookpassS3?: S3Client; nookpassBucketReady?: Promise<void> };

function client(): S3Client {
  if (!g.nookpassS3) {
    const c = storageConfig();
    g.nookpassS3 = new S3Client({
      endpoint: c.endpoint,
      region: c.region,
      forcePathStyle: true,
      credentials: { accessKeyId: c.accessKeyId, secretAccessKey: c.secretAccessKey },
      requestChecksumCalculation: 'WHEN_REQUIRED',
      responseChecksumValidation: 'WHEN_REQUIRED',
      maxAttempts: 2,
    });
  }
  return g.nookpassS3;
}

function unavailable(err: unknown): never {
  log.error({ err }, 'file storage not reachable');
  throw new ServiceUnavailableError('File storage is not reachable right now; nothing was saved. Try again in a moment.');
}

async function ensureBucket(): Promise<void> {
  g.nookpassBucketReady ??= (async () => {
    const { bucket } = storageConfig();
    try {
      await client().send(new HeadBucketCommand({ Bucket: bucket }));
    } catch {
      await client().send(new CreateBucketCommand({ Bucket: bucket }));
    }
  })().catch((err) => {
    g.nookpassBucketReady = undefined;
    throw err;
  });
  return g.nookpassBucketReady;
}

export async function putObject(key: string, body: Buffer, contentType: string): Promise<void> {
  try {
    await ensureBucket();
    await client().send(new PutObjectCommand({ Bucket: storageConfig().bucket, Key: key, Body: body, ContentType: contentType }));
  } catch (err) {
    unavailable(err);
  }
}

export async function findObject(key: string): Promise<Buffer | null> {
  try {
    const res = await client().send(new GetObjectCommand({ Bucket: storageConfig().bucket, Key: key }));
    return Buffer.from(await res.Body!.transformToByteArray());
  } catch (err) {
    if ((err as { name?: string }).name === 'NoSuchKey' || (err as { $metadata?: { httpStatusCode?: number } }).$metadata?.httpStatusCode === 404) return null;
    unavailable(err);
  }
}

export async function deleteObject(key: string): Promise<void> {
  try {
    await client().send(new DeleteObjectCommand({ Bucket: storageConfig().bucket, Key: key }));
  } catch (err) {
    unavailable(err);
  }
}

/** Every stored object under `prefix`, page by page (ListObjectsV2). */
export async function* listObjects(prefix: string): AsyncGenerator<{ key: string; lastModified: Date | null }> {
  let token: string | undefined;
  do {
    let page;
    try {
      await ensureBucket();
      page = await client().send(new ListObjectsV2Command({ Bucket: storageConfig().bucket, Prefix: prefix, ContinuationToken: token }));
    } catch (err) {
      unavailable(err);
    }
    for (const o of page.Contents ?? []) if (o.Key) yield { key: o.Key, lastModified: o.LastModified ?? null };
    token = page.IsTruncated ? page.NextContinuationToken : undefined;
  } while (token);
}
