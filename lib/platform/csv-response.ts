import 'server-only';
import { create as contentDisposition } from 'content-disposition';

/** A CSV download (RFC 4180 §3 media type; RFC 6266 attachment with the file name). */
export function csvResponse(csv: string, fileName: string): Response {
  return new Response(csv, {
    headers: {
      'content-type': 'text/csv; charset=utf-8; header=present',
      'content-disposition': contentDisposition(fileName),
      'cache-control': 'no-store',
      'x-content-type-options': 'nosniff',
    },
  });
}
