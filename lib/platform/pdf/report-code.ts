import { createHash } from 'node:crypto';

export function sha256Hex(bytes: Uint8Array): string {
  return createHash('sha256').update(bytes).digest('hex');
}

/** Pages in the PDF: the page tree root's /Count, the largest /Count in the file. */
export function countPdfPages(pdf: Buffer): number {
  const counts = [...pdf.toString('latin1').matchAll(/\/Count\s+(\d+)/g)].map((m) => Number(m[1]));
  return counts.length ? Math.max(...counts) : 0;
}

const ALPHABET = '23456789ABCDEFGHJKLMNPQRSTUVWXYZ'; // no 0/O, 1/I: codes are read aloud and typed

/** A report code like NP-7K3Q-M9TD: 40 random bits, easy to read over the phone. */
export function newReportCode(random: (n: number) => Buffer): string {
  const bytes = random(8);
  let out = '';
  for (let i = 0; i < 8; i++) out += ALPHABET[bytes[i] % 32];
  return `NP-${out.slice(0, 4)}-${out.slice(4)}`;
}
