import 'server-only';
import busboy from 'busboy';
import { PayloadTooLargeError, ValidationError } from '@/lib/domain/errors';

export type MultipartLimits = {
  /** The one file part's field name. */
  fileField: string;
  maxFileBytes: number;
  /** The text fields accepted besides the file; anything else is refused. */
  fields: readonly string[];
  maxFieldBytes: number;
  /** What the person who sent too large a file reads. */
  tooLargeMessage: string;
};

export type MultipartUpload = {
  file: { filename: string; mimeType: string; bytes: Buffer } | null;
  fields: Record<string, string>;
};

// Part headers and boundaries: a generous allowance on top of the file and the fields.
const FRAMING_BYTES = 64 * 1024;

/**
 * Reads a multipart/form-data upload with one file, streaming: the file's bytes are counted as they
 * arrive and the upload is refused once it passes its limit, so a chunked body with no length is
 * never held beyond the limit. Only the file itself (at most `maxFileBytes`) is kept in memory.
 */
export async function readMultipartUpload(request: Request, limits: MultipartLimits): Promise<MultipartUpload> {
  const type = request.headers.get('content-type') ?? '';
  if (!/^multipart\/form-data/i.test(type)) {
    throw new ValidationError([{ path: '(body)', message: `Send the file as multipart/form-data with a "${limits.fileField}" field.` }]);
  }
  const maxTotal = limits.maxFileBytes + limits.fields.length * limits.maxFieldBytes + FRAMING_BYTES;
  if (Number(request.headers.get('content-length') ?? '0') > maxTotal) throw new PayloadTooLargeError(limits.tooLargeMessage);
  if (!request.body) throw new ValidationError([{ path: limits.fileField, message: 'Choose a file to upload.' }]);

  let parser: busboy.Busboy;
  try {
    parser = busboy({
      headers: { 'content-type': type },
      // Browsers send the file name as raw UTF-8; busboy's default (latin1) would garble any other script.
      defParamCharset: 'utf8',
      limits: {
        files: 1,
        // One byte over the limit, so a file of exactly the limit is accepted and 'limit' means "too large".
        fileSize: limits.maxFileBytes + 1,
        fields: limits.fields.length,
        parts: limits.fields.length + 1,
        fieldSize: limits.maxFieldBytes,
        fieldNameSize: 100,
        headerPairs: 20,
      },
    });
  } catch {
    throw new ValidationError([{ path: '(body)', message: 'The upload could not be read: the multipart boundary is missing.' }]);
  }

  const fields: Record<string, string> = {};
  // Set from the parser's events, read by the loop below.
  const state: { file: MultipartUpload['file']; failure: Error | null; closed: boolean } = { file: null, failure: null, closed: false };
  let wake: () => void = () => undefined;
  const fail = (err: Error) => {
    state.failure ??= err;
    wake();
  };

  parser.on('file', (name, stream, info) => {
    if (name !== limits.fileField || state.file) {
      stream.resume();
      fail(new ValidationError([{ path: name, message: `Send one file, in the "${limits.fileField}" field.` }]));
      return;
    }
    const chunks: Buffer[] = [];
    stream.on('data', (c: Buffer) => chunks.push(c));
    stream.on('limit', () => fail(new PayloadTooLargeError(limits.tooLargeMessage)));
    // A body cut off inside the file (or the parser destroyed after a refusal) errors this stream; the refusal
    // is already recorded, and an error with no listener would be thrown out of the process.
    stream.on('error', () => fail(new ValidationError([{ path: limits.fileField, message: 'The upload was cut off before the file ended.' }])));
    stream.on('end', () => {
      if (!stream.truncated) state.file = { filename: info.filename ?? '', mimeType: info.mimeType, bytes: Buffer.concat(chunks) };
    });
  });
  parser.on('field', (name, value, info) => {
    if (!limits.fields.includes(name)) fail(new ValidationError([{ path: name, message: `Unexpected field "${name.slice(0, 100)}".` }]));
    else if (info.valueTruncated) fail(new ValidationError([{ path: name, message: `The ${name} is too long.` }]));
    else fields[name] = value;
  });
  // busboy emits these when one more file or field arrives than allowed ('partsLimit' fires on reaching its
  // limit instead, so it is not listened to: parts past it are skipped, and still counted in maxTotal).
  for (const event of ['filesLimit', 'fieldsLimit'] as const) {
    parser.on(event, () => fail(new ValidationError([{ path: '(body)', message: `Send one file and at most: ${limits.fields.join(', ')}.` }])));
  }
  parser.on('error', () => fail(new ValidationError([{ path: '(body)', message: 'The upload could not be read; it may have been cut off.' }])));
  parser.on('close', () => {
    state.closed = true;
    wake();
  });
  parser.on('drain', () => wake());

  const reader = request.body.getReader();
  let total = 0;
  try {
    while (!state.failure) {
      const { done, value } = await reader.read();
      if (done) {
        parser.end();
        break;
      }
      total += value.byteLength;
      if (total > maxTotal) {
        fail(new PayloadTooLargeError(limits.tooLargeMessage));
        break;
      }
      // Backpressure: wait for the parser (and the file stream behind it) before reading more.
      if (!parser.write(value)) await new Promise<void>((resolve) => (wake = resolve));
    }
    while (!state.failure && !state.closed) await new Promise<void>((resolve) => (wake = resolve));
  } finally {
    if (state.failure) {
      await reader.cancel().catch(() => undefined);
      parser.destroy();
    }
  }
  if (state.failure) throw state.failure;
  return { file: state.file, fields };
}
