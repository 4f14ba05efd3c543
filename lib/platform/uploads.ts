import 'server-only';
import { createHash } from 'node:crypto';
import { fileTypeFromBuffer } from 'file-type';
import sharp from 'sharp';
import { PayloadTooLargeError, ValidationError } from '@/lib/domain/errors';

export const MAX_UPLOAD_BYTES = 15 * 1024 * 1024;
// 40 megapixels covers any phone camera; more is a decompression bomb, refused before decoding.
export const MAX_IMAGE_PIXELS = 40_000_000;

const IMAGE_TYPES = new Set(['image/jpeg', 'image/png', 'image/webp']);
const DOCUMENT_TYPES = new Set(['application/pdf']);
const EXT: Record<string, string[]> = {
  'image/jpeg': ['jpg', 'jpeg'],
  'image/png': ['png'],
  'image/webp': ['webp'],
  'application/pdf': ['pdf'],
};

/** A safe display name: no folders, no control characters, a sane length. */
export function safeFilename(name: string): string {
  const base = name.replace(/\\/g, '/').split('/').pop() ?? '';
  const cleaned = base.replace(/[\u0000-\u001f\u007f<>:"|?*]/g, '').replace(/^\.+/, '').trim();
  // By code point, so an emoji at the cut is not split into half a surrogate pair.
  return [...(cleaned || 'upload')].slice(0, 120).join('');
}

/** The thumbnail's longest side on pages, in pixels. */
export const THUMBNAIL_MAX_SIDE_PX = 480;
/** The report-size image's longest side; smaller photos keep their size. */
export const REPORT_IMAGE_MAX_SIDE_PX = 1400;

export type CheckedUpload = {
  kind: 'photo' | 'document';
  contentType: string;
  filename: string;
  bytes: Buffer;
  sha256: string;
  width: number | null;
  height: number | null;
};

/**
 * The photo at full size with no metadata: sharp writes none unless asked (withMetadata/keepExif), and
 * .rotate() bakes the EXIF orientation into the pixels first so the picture stays the right way up.
 */
export async function stripPhotoMetadata(bytes: Buffer, contentType: string): Promise<Buffer> {
  const image = sharp(bytes, { limitInputPixels: MAX_IMAGE_PIXELS, failOn: 'error' }).rotate();
  if (contentType === 'image/png') return image.png().toBuffer();
  if (contentType === 'image/webp') return image.webp({ quality: 92 }).toBuffer();
  return image.jpeg({ quality: 92 }).toBuffer();
}

/** The moderate JPEG a report embeds, re-encoded so no metadata rides along. */
export async function makeReportImage(bytes: Buffer): Promise<Buffer> {
  return sharp(bytes, { limitInputPixels: MAX_IMAGE_PIXELS, failOn: 'error' })
    .rotate()
    .resize(REPORT_IMAGE_MAX_SIDE_PX, REPORT_IMAGE_MAX_SIDE_PX, { fit: 'inside', withoutEnlargement: true })
    .jpeg({ quality: 80 })
    .toBuffer();
}

export type PhotoDerivatives = { thumbnail: Buffer; display: Buffer; withoutMetadata: Buffer };

/** Everything made from a stored photo: the same bytes every time for the same photo, so a second run changes nothing. */
export async function makePhotoDerivatives(bytes: Buffer, contentType: string): Promise<PhotoDerivatives> {
  const thumbnail = await sharp(bytes, { limitInputPixels: MAX_IMAGE_PIXELS, failOn: 'error' })
    .rotate()
    .resize(THUMBNAIL_MAX_SIDE_PX, THUMBNAIL_MAX_SIDE_PX, { fit: 'inside' })
    .jpeg({ quality: 78 })
    .toBuffer();
  const display = await makeReportImage(bytes);
  const withoutMetadata = await stripPhotoMetadata(bytes, contentType);
  return { thumbnail, display, withoutMetadata };
}

/**
 * Checks the real type from the bytes (not the name or the browser's claim), the size and the image's header.
 * Only the header is read here: decoding and resizing happen in the job that makes the thumbnails.
 */
export async function checkUpload(bytes: Buffer, declaredName: string): Promise<CheckedUpload> {
  if (bytes.length === 0) throw new ValidationError([{ path: 'file', message: 'The file is empty.' }]);
  if (bytes.length > MAX_UPLOAD_BYTES) throw new PayloadTooLargeError(`Files can be at most ${MAX_UPLOAD_BYTES / 1024 / 1024} MB.`);
  const filename = safeFilename(declaredName);
  const detected = await fileTypeFromBuffer(bytes);
  const type = detected?.mime;
  if (!type || (!IMAGE_TYPES.has(type) && !DOCUMENT_TYPES.has(type))) {
    throw new ValidationError([{ path: 'file', message: 'Upload a photo (JPEG, PNG or WebP) or a PDF document; this file is neither.' }]);
  }
  const ext = filename.includes('.') ? filename.split('.').pop()!.toLowerCase() : '';
  if (ext && !EXT[type].includes(ext)) {
    throw new ValidationError([{ path: 'file', message: `The file is a ${EXT[type][0].toUpperCase()} but is named .${ext}; rename it or upload the right file.` }]);
  }
  const sha256 = createHash('sha256').update(bytes).digest('hex');
  if (DOCUMENT_TYPES.has(type)) {
    return { kind: 'document', contentType: type, filename, bytes, sha256, width: null, height: null };
  }
  let width: number | undefined;
  let height: number | undefined;
  try {
    // Header only: nothing is decoded, so the pixel limit is checked below with a message of its own.
    ({ width, height } = await sharp(bytes, { limitInputPixels: false, failOn: 'error' }).metadata());
  } catch {
    // An unreadable header is refused here; damage further in shows when the job decodes the photo.
  }
  if (!width || !height) throw new ValidationError([{ path: 'file', message: 'The image could not be read; it may be damaged.' }]);
  // The header states the size, so a decompression bomb is refused before anything decodes it.
  if (width * height > MAX_IMAGE_PIXELS) {
    throw new ValidationError([{ path: 'file', message: `The image has more than ${MAX_IMAGE_PIXELS / 1e6} megapixels; resize it before uploading.` }]);
  }
  return { kind: 'photo', contentType: type, filename, bytes, sha256, width, height };
}
