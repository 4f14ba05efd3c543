// Entry of the report worker thread: the pool in render-pool.ts sends it a ReportData and gets the PDF back.
// Built to .next/report-worker/render-worker.mjs by scripts/build-report-worker.mjs; run from source in development.
import { renderReportPdf, type RenderedReport } from '@/lib/platform/pdf/render';
import type { ReportData } from '@/lib/domain/reports/report-data';

/** Bytes arrive as a plain Uint8Array (structured clone drops the Buffer class); react-pdf's Image wants a Buffer. */
function asBuffer(bytes: Uint8Array): Buffer {
  return Buffer.isBuffer(bytes) ? bytes : Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
}

export default async function renderInWorker(data: ReportData): Promise<RenderedReport> {
  return renderReportPdf({ ...data, photos: data.photos.map((p) => ({ ...p, image: asBuffer(p.image) })) });
}
