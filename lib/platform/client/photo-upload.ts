// Photos from a phone camera are often 4000 px and more across; scaling them in the browser before the upload
// saves the installer's mobile data and the upload time, and is plenty for a report page.
import { ApiError } from '@/lib/platform/client/fetch-json';

/** Longest side of a photo after the browser scales it down. */
export const MAX_PHOTO_SIDE_PX = 2560;
/** JPEG quality of a scaled photo (common practice for photos, no published source). */
export const PHOTO_JPEG_QUALITY = 0.85;

/** The size a photo is scaled to: the longest side at most `maxSide`, the aspect ratio kept, never enlarged. */
export function scaledSize(width: number, height: number, maxSide = MAX_PHOTO_SIDE_PX): { width: number; height: number; scaled: boolean } {
  if (!(width > 0 && height > 0)) throw new RangeError(`An image has no size (${width} × ${height}).`);
  const longest = Math.max(width, height);
  if (longest <= maxSide) return { width, height, scaled: false };
  const factor = maxSide / longest;
  // The longest side lands exactly on the limit; the other is rounded and never drops to nothing.
  return width >= height
    ? { width: maxSide, height: Math.max(1, Math.round(height * factor)), scaled: true }
    : { width: Math.max(1, Math.round(width * factor)), height: maxSide, scaled: true };
}

export interface PreparedFile {
  file: File;
  /** Set when the photo was scaled: the sizes before and after. */
  scaledFrom?: { width: number; height: number; toWidth: number; toHeight: number };
}

/** Scales a photo larger than the limit down to a JPEG; PDFs, small photos and images the browser cannot read pass as they are. */
export async function preparePhoto(file: File): Promise<PreparedFile> {
  if (!/^image\/(jpeg|png|webp)$/.test(file.type)) return { file };
  let bitmap: ImageBitmap;
  try {
    bitmap = await createImageBitmap(file, { imageOrientation: 'from-image' });
  } catch {
    return { file }; // the server says what is wrong with it
  }
  try {
    const size = scaledSize(bitmap.width, bitmap.height);
    if (!size.scaled) return { file };
    const canvas = document.createElement('canvas');
    canvas.width = size.width;
    canvas.height = size.height;
    const ctx = canvas.getContext('2d');
    if (!ctx) return { file };
    // JPEG has no transparency: a transparent PNG gets a white ground rather than black.
    ctx.fillStyle = '#ffffff';
    ctx.fillRect(0, 0, size.width, size.height);
    ctx.imageSmoothingQuality = 'high';
    ctx.drawImage(bitmap, 0, 0, size.width, size.height);
    const blob = await new Promise<Blob | null>((resolve) => canvas.toBlob(resolve, 'image/jpeg', PHOTO_JPEG_QUALITY));
    if (!blob) return { file };
    const name = `${file.name.replace(/\.[^.]*$/, '') || 'photo'}.jpg`;
    return {
      file: new File([blob], name, { type: 'image/jpeg', lastModified: file.lastModified }),
      scaledFrom: { width: bitmap.width, height: bitmap.height, toWidth: size.width, toHeight: size.height },
    };
  } finally {
    bitmap.close();
  }
}

/** Posts a multipart form and reports the share of it sent (0 to 1); our error shape becomes an ApiError. */
export function uploadWithProgress<T>(url: string, form: FormData, onProgress: (sent: number) => void): Promise<T> {
  return new Promise<T>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', url);
    xhr.responseType = 'text';
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable && e.total > 0) onProgress(e.loaded / e.total);
    };
    xhr.onload = () => {
      let data: any = null;
      try {
        data = xhr.responseText ? JSON.parse(xhr.responseText) : null;
      } catch {
        data = null;
      }
      if (xhr.status >= 200 && xhr.status < 300) {
        onProgress(1);
        resolve(data as T);
      } else {
        reject(new ApiError(data?.error ?? `Upload failed (${xhr.status}).`, xhr.status, data?.errors ?? []));
      }
    };
    xhr.onerror = () => reject(new ApiError('The upload did not reach the server; check the connection and try again.', 0));
    xhr.onabort = () => reject(new ApiError('The upload was stopped.', 0));
    xhr.send(form);
  });
}
