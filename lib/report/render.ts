import { createHash } from 'node:crypto';
import { renderToBuffer } from '@react-pdf/renderer';
import { createElement } from 'react';
import { registerReportFonts, ReportDocument } from './report-document';
import type { ReportData } from './report-data';

export function sha256Hex(bytes: Uint8Array): string {
  return createHash('sha256').update(bytes).digest('hex');
}

/** Pages in the PDF: the page tree root's /Count, the largest /Count in the file. */
export function countPdfPages(pdf: Buffer): number {
  const counts = [...pdf.toString('latin1').matchAll(/\/Count\s+(\d+)/g)].map((m) => Number(m[1]));
  return counts.length ? Math.max(...counts) : 0;
}

export async function renderReportPdf(data: ReportData): Promise<{ pdf: Buffer; sha256: string; pageCount: number }> {
  registerReportFonts();
  const pdf = Buffer.from(await renderToBuffer(createElement(ReportDocument, { data }) as Parameters<typeof renderToBuffer>[0]));
  return { pdf, sha256: sha256Hex(pdf), pageCount: countPdfPages(pdf) };
}
