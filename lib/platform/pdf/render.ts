import { renderToBuffer } from '@react-pdf/renderer';
import { createElement } from 'react';
import { registerReportFonts, ReportDocument } from '@/lib/platform/pdf/report-document';
import { countPdfPages, sha256Hex } from '@/lib/platform/pdf/report-code';
import { verifyQrPng } from '@/lib/platform/pdf/verify-qr';
import type { ReportData } from '@/lib/domain/reports/report-data';

// The code helpers live apart so request handlers use them without loading the PDF renderer.
export { countPdfPages, sha256Hex } from '@/lib/platform/pdf/report-code';

export type RenderedReport = { pdf: Buffer; sha256: string; pageCount: number };

/**
 * Renders the report on the calling thread. CPU-bound for seconds on a large plan: request handlers
 * go through renderReportOffThread (render-pool.ts), which runs this in a worker thread.
 */
export async function renderReportPdf(data: ReportData): Promise<RenderedReport> {
  registerReportFonts();
  const verifyQr = await verifyQrPng(data.verifyUrl);
  const pdf = Buffer.from(await renderToBuffer(createElement(ReportDocument, { data, verifyQr }) as Parameters<typeof renderToBuffer>[0]));
  return { pdf, sha256: sha256Hex(pdf), pageCount: countPdfPages(pdf) };
}
