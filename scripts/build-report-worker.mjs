// Bundles the worker threads' entries (the report worker, lib/platform/pdf/render-worker.ts, and the evaluation
// worker, lib/platform/evaluation/evaluate-worker.ts, each with what it imports from the app) into ES modules
// that plain Node loads in a worker thread. Next's build does not emit a file a worker thread can
// load by path, so this runs after `next build`; packages stay in node_modules, as the server loads them.
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { build } from 'esbuild';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
// Beside the build it belongs to: NOOKPASS_DIST_DIR is the build folder when it is not .next (npm test).
export const defaultOutfile = path.join(root, process.env.NOOKPASS_DIST_DIR || '.next', 'report-worker', 'render-worker.mjs');

export const defaultEvaluationOutfile = path.join(root, process.env.NOOKPASS_DIST_DIR || '.next', 'evaluation-worker', 'evaluate-worker.mjs');

async function bundle(entry, outfile) {
  await build({
    entryPoints: [entry],
    outfile,
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    jsx: 'automatic',
    packages: 'external',
    tsconfig: path.join(root, 'tsconfig.json'),
    logLevel: 'warning',
    legalComments: 'none',
  });
  return outfile;
}

export function buildReportWorker(outfile = defaultOutfile) {
  return bundle(path.join(root, 'lib', 'platform', 'pdf', 'render-worker.ts'), outfile);
}

export function buildEvaluationWorker(outfile = defaultEvaluationOutfile) {
  return bundle(path.join(root, 'lib', 'platform', 'evaluation', 'evaluate-worker.ts'), outfile);
}

if (import.meta.url === pathToFileURL(process.argv[1]).href) {
  const out = await buildReportWorker(process.argv[2] ? path.resolve(process.argv[2]) : defaultOutfile);
  console.log(`[build] report worker → ${path.relative(root, out)}`);
  // The evaluation worker goes beside it unless a report worker path was named (development rebuilds only that one).
  if (!process.argv[2]) console.log(`[build] evaluation worker → ${path.relative(root, await buildEvaluationWorker())}`);
}
