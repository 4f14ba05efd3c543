// Types of scripts/build-report-worker.mjs (a plain Node script, so `npm run build` needs no TypeScript loader).
declare module '@/scripts/build-report-worker.mjs' {
  /** Bundles lib/platform/pdf/render-worker.ts into one ES module a worker thread loads; resolves to the file written. */
  export function buildReportWorker(outfile?: string): Promise<string>;
  /** Bundles lib/platform/evaluation/evaluate-worker.ts the same way. */
  export function buildEvaluationWorker(outfile?: string): Promise<string>;
  export const defaultOutfile: string;
  export const defaultEvaluationOutfile: string;
}
