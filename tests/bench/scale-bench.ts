import { sql } from 'kysely';
import { createDb } from '@/db/index';
import { SCALE_EMAIL_DOMAIN, SCALE_SLUG_PREFIX } from '@/db/scale-seed';
import { computeImpact } from '@/lib/services/rule-sets/comparisons';
import { api, postJson, signIn } from '../integration/helpers';
import { measureOutbox } from './outbox-bench';

/*
 * Figures on the scale scenario (`npm run seed:scale`, added to the bench database by scripts/bench.sh): list API
 * latencies as one person sees them (requests one after another through the served app), and the impact run over
 * every open project of one jurisdiction as the impact page runs it: queued through the served app, done by a worker,
 * polled to the end (and, for comparison, the same service timed in-process).
 */

const percentile = (xs: number[], p: number) => {
  const sorted = [...xs].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
};
const round = (ms: number) => Math.round(ms * 10) / 10;

async function timeList(path: string, cookie: string, runs: number) {
  let total = -1;
  for (let i = 0; i < 3; i++) await api(path, { cookie }); // warm: compiled route, pooled connections
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    const res = await api(path, { cookie });
    times.push(performance.now() - t0);
    if (res.status !== 200) throw new Error(`${path} answered ${res.status}: ${JSON.stringify(res.body).slice(0, 200)}`);
    total = res.body.total;
  }
  return { path, runs, total, p50Ms: round(percentile(times, 50)), p95Ms: round(percentile(times, 95)), maxMs: round(Math.max(...times)) };
}

/** An impact run from the POST that queues it to the poll that finds it done: the job path an admin waits for. */
export async function timeImpactJob(slug: string, cookie: string, timeoutMs = 30 * 60_000) {
  const t0 = performance.now();
  const start = await api(`/api/jurisdictions/${slug}/impact-runs`, postJson({}, { cookie }));
  if (start.status !== 202) throw new Error(`impact run answered ${start.status}: ${JSON.stringify(start.body).slice(0, 200)}`);
  const path = start.headers.get('location')!;
  for (;;) {
    const res = await api(path, { cookie });
    if (res.status !== 200) throw new Error(`${path} answered ${res.status}`);
    if (res.body.state === 'done') return { ms: Math.round(performance.now() - t0), total: res.body.total as number, runId: res.body.id as string };
    if (res.body.state === 'failed') throw new Error(`impact run failed: ${res.body.error}`);
    if (performance.now() - t0 > timeoutMs) throw new Error(`impact run not done within ${timeoutMs} ms`);
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}

export async function measureScale(runs = 60) {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error('DATABASE_URL is not set: run through npm run bench.');
  const db = createDb(url, 2);
  try {
    const counts = await sql<{ projects: number; revisions: number; checks: number; reports: number }>`
      SELECT (SELECT count(*) FROM projects)::int AS projects, (SELECT count(*) FROM plan_revisions)::int AS revisions,
             (SELECT count(*) FROM checks)::int AS checks, (SELECT count(*) FROM reports)::int AS reports`.execute(db);
    const installerEmail = `owner@harbor.${SCALE_EMAIL_DOMAIN}`;
    const jurisdictionSlug = `${SCALE_SLUG_PREFIX}river-city`;
    const installer = await signIn(installerEmail);
    const inspector = await signIn(`inspector@river-city.${SCALE_EMAIL_DOMAIN}`);

    const firstPage = await timeList('/api/projects', installer, runs);
    // A street name typed into the search: it matches about a tenth of the company's projects.
    const search = await timeList('/api/projects?q=Sketch', installer, runs);
    const sortByName = await timeList('/api/projects?sort=name&dir=asc', installer, runs);
    const inspections = await timeList('/api/inspections', inspector, runs);

    const jurisdiction = await db.selectFrom('jurisdictions').select('id').where('slug', '=', jurisdictionSlug).executeTakeFirstOrThrow();
    await computeImpact(db, jurisdiction.id); // warm: rule set compiled once per version
    const t0 = performance.now();
    const impact = await computeImpact(db, jurisdiction.id);
    const impactInProcessMs = Math.round(performance.now() - t0);
    // The job path: the first run warms the served app's rule set cache, the second is the figure.
    const admin = await signIn('admin@nookpass.demo');
    await timeImpactJob(jurisdictionSlug, admin);
    const job = await timeImpactJob(jurisdictionSlug, admin);
    const impactJobMs = job.ms;
    // 200 e-mails recorded at once and delivered by the served app's workers through the local relay.
    const outbox = await measureOutbox(200);
    const states: Record<string, number> = {};
    for (const item of impact.items) states[item.state] = (states[item.state] ?? 0) + 1;

    return {
      projects: counts.rows[0].projects,
      planRevisions: counts.rows[0].revisions,
      checks: counts.rows[0].checks,
      reports: counts.rows[0].reports,
      projectsListP50Ms: firstPage.p50Ms,
      projectsListP95Ms: firstPage.p95Ms,
      projectsSearchP50Ms: search.p50Ms,
      projectsSearchP95Ms: search.p95Ms,
      projectsSortP50Ms: sortByName.p50Ms,
      projectsSortP95Ms: sortByName.p95Ms,
      inspectionsListP50Ms: inspections.p50Ms,
      inspectionsListP95Ms: inspections.p95Ms,
      impactJobMs,
      outboxPerSecond: outbox.outboxPerSecond,
      detail: {
        installer: installerEmail,
        lists: [firstPage, search, sortByName, inspections],
        outbox,
        impact: {
          jurisdiction: jurisdictionSlug,
          projects: impact.items.length,
          jobProjects: job.total,
          states,
          measured: 'impactJobMs: POST …/impact-runs to the poll that finds it done (queue pickup, batched evaluation with progress, stored result), warm; impactInProcessMs: computeImpact in-process, warm',
          impactInProcessMs,
        },
      },
    };
  } finally {
    await db.destroy();
  }
}
