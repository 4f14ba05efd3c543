import { sql } from 'kysely';
import { isUuid } from '@/lib/domain/ids';
import type { DB } from '@/db/index';
import { writeAudit } from '@/db/audit';
import { receivedByInspector } from '@/db/reports';
import type { CheckOutcome, ReviewOutcome } from '@/db/types';
import type { EvaluationSummary } from '@/lib/domain/engine';
import type { ProjectInput, ProjectListQuery, ProjectUpdateInput } from '@/lib/domain/projects/schema';
import type { AppUser } from '@/lib/domain/roles';
import { ForbiddenError, NotFoundError, ValidationError } from '@/lib/domain/errors';

export type Project = {
  id: string;
  organizationId: string;
  organizationName: string;
  jurisdiction: { id: string; slug: string; name: string; timeZone: string };
  name: string;
  siteAddress: string;
  permitNumber: string | null;
  notes: string;
  isDemo: boolean;
  archivedAt: Date | null;
  createdAt: Date;
  updatedAt: Date;
  latestCheck: { id: string; outcome: CheckOutcome; summary: EvaluationSummary; createdAt: Date } | null;
  latestRevision: number | null;
  inspection: ProjectInspection;
};

/**
 * Where the project stands with the inspector: the latest recorded outcome of the report last sent to the
 * jurisdiction's inspector address, `awaiting-inspector` while that report has none, `not-sent` when no report
 * has reached the inspector (downloads and copies to other addresses do not).
 */
export type ProjectInspection = {
  status: 'not-sent' | 'awaiting-inspector' | ReviewOutcome;
  reportCode: string | null;
  sentAt: Date | null;
  reviewedAt: Date | null;
};

function baseQuery(db: DB) {
  return db
    .selectFrom('projects as p')
    .innerJoin('jurisdictions as j', 'j.id', 'p.jurisdiction_id')
    .innerJoin('organizations as o', 'o.id', 'p.organization_id')
    .leftJoinLateral(
      (eb) =>
        eb
          .selectFrom('checks as c')
          .select(['c.id as check_id', 'c.outcome', 'c.summary', 'c.created_at as checked_at'])
          .whereRef('c.project_id', '=', 'p.id')
          .orderBy('c.created_at', 'desc')
          .limit(1)
          .as('lc'),
      (join) => join.onTrue(),
    )
    .leftJoinLateral(
      (eb) =>
        eb.selectFrom('plan_revisions as r').select((e) => e.fn.max('r.number').as('latest_revision')).whereRef('r.project_id', '=', 'p.id').as('lr'),
      (join) => join.onTrue(),
    )
    // The report last sent to the inspector and its latest outcome, in the same query (no per-row lookups).
    .leftJoinLateral(
      (eb) =>
        eb
          .selectFrom('report_sends as s')
          .innerJoin('jurisdictions as sj', 'sj.id', 's.jurisdiction_id')
          .innerJoin('reports as rr', 'rr.id', 's.report_id')
          .select(['s.report_id as sent_report_id', 'rr.code as sent_report_code', 's.created_at as sent_at'])
          .whereRef('s.project_id', '=', 'p.id')
          .where('s.status', '=', 'sent')
          .where(receivedByInspector('s', 'sj'))
          .orderBy('s.created_at', 'desc')
          .limit(1)
          .as('ls'),
      (join) => join.onTrue(),
    )
    .leftJoinLateral(
      (eb) =>
        eb
          .selectFrom('inspection_reviews as v')
          .select(['v.outcome as review_outcome', 'v.created_at as reviewed_at'])
          .whereRef('v.report_id', '=', 'ls.sent_report_id')
          .orderBy('v.created_at', 'desc')
          .limit(1)
          .as('lv'),
      (join) => join.onTrue(),
    )
    .select([
      'p.id', 'p.organization_id', 'o.name as organization_name', 'p.name', 'p.site_address', 'p.permit_number', 'p.notes',
      'p.is_demo', 'p.archived_at', 'p.created_at', 'p.updated_at',
      'j.id as jurisdiction_id', 'j.slug as jurisdiction_slug', 'j.name as jurisdiction_name', 'j.time_zone as jurisdiction_time_zone',
      'lc.check_id', 'lc.outcome', 'lc.summary', 'lc.checked_at', 'lr.latest_revision',
      'ls.sent_report_code', 'ls.sent_at', 'lv.review_outcome', 'lv.reviewed_at',
    ]);
}

type Row = Awaited<ReturnType<ReturnType<typeof baseQuery>['executeTakeFirstOrThrow']>>;

function toProject(r: Row): Project {
  return {
    id: r.id,
    organizationId: r.organization_id,
    organizationName: r.organization_name,
    jurisdiction: { id: r.jurisdiction_id, slug: r.jurisdiction_slug, name: r.jurisdiction_name, timeZone: r.jurisdiction_time_zone },
    name: r.name,
    siteAddress: r.site_address,
    permitNumber: r.permit_number,
    notes: r.notes,
    isDemo: r.is_demo,
    archivedAt: r.archived_at,
    createdAt: r.created_at,
    updatedAt: r.updated_at,
    latestCheck: r.check_id
      ? { id: r.check_id, outcome: r.outcome as CheckOutcome, summary: summaryCounts(r.summary), createdAt: r.checked_at as Date }
      : null,
    latestRevision: r.latest_revision == null ? null : Number(r.latest_revision),
    inspection: {
      status: r.review_outcome ?? (r.sent_report_code ? 'awaiting-inspector' : 'not-sent'),
      reportCode: r.sent_report_code ?? null,
      sentAt: r.sent_at ?? null,
      reviewedAt: r.reviewed_at ?? null,
    },
  };
}

// The summary's shape has never changed since checks were first stored; a missing count reads as none.
function summaryCounts(stored: unknown): EvaluationSummary {
  const s = (stored ?? {}) as Partial<Record<keyof EvaluationSummary, unknown>>;
  const n = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? v : 0);
  return { pass: n(s.pass), fail: n(s.fail), caution: n(s.caution), needsInfo: n(s.needsInfo), notApplicable: n(s.notApplicable) };
}

/** Who may see a project: its own company's installers and admins. Others get a 404, not a hint that it exists. */
export function scopeForUser(user: AppUser): { organizationId: string | null } {
  if (user.role === 'admin') return { organizationId: null };
  if (user.role === 'installer' && user.organizationId) return { organizationId: user.organizationId };
  throw new ForbiddenError('Projects belong to installers’ companies.');
}

export async function listProjects(db: DB, user: AppUser, q: ProjectListQuery): Promise<{ items: Project[]; total: number }> {
  const scope = scopeForUser(user);
  // The filter and the order pick one page of ids first; the latest check, revision and inspection are then
  // looked up for that page only, and the total counts projects without them (they never drop a row).
  let filtered = db.selectFrom('projects as p');
  if (scope.organizationId) filtered = filtered.where('p.organization_id', '=', scope.organizationId);
  if (q.archived === '0') filtered = filtered.where('p.archived_at', 'is', null);
  if (q.archived === '1') filtered = filtered.where('p.archived_at', 'is not', null);
  if (q.q) {
    const like = `%${q.q.replace(/[\\%_]/g, (c) => '\\' + c)}%`;
    // Jurisdictions matching by name become a list of ids, so every branch of the OR is on projects and each
    // can use its own index (trigram indexes on the texts, the jurisdiction index on the ids).
    const jurisdictionIds = sql<string[]>`array(${db.selectFrom('jurisdictions').select('id').where('name', 'ilike', like)})`;
    filtered = filtered.where((eb) =>
      eb.or([
        eb('p.name', 'ilike', like),
        eb('p.site_address', 'ilike', like),
        eb('p.permit_number', 'ilike', like),
        eb('p.jurisdiction_id', '=', eb.fn.any(jurisdictionIds)),
      ]),
    );
  }
  const sortColumn = { updated: 'p.updated_at', name: 'p.name', jurisdiction: 'j.name', created: 'p.created_at' } as const;
  // The page joins jurisdictions for the jurisdiction sort; the count reads projects alone (index-only where it can).
  const page = filtered
    .innerJoin('jurisdictions as j', 'j.id', 'p.jurisdiction_id')
    .select(['p.id as page_id', sql.ref(sortColumn[q.sort]).as('page_key')])
    .orderBy(sortColumn[q.sort], q.dir)
    .orderBy('p.id')
    .limit(q.pageSize)
    .offset((q.page - 1) * q.pageSize);
  const [rows, count] = await Promise.all([
    baseQuery(db).innerJoin(page.as('pg'), 'pg.page_id', 'p.id').orderBy('pg.page_key', q.dir).orderBy('p.id').execute(),
    filtered.select(sql<number>`count(*)`.as('n')).executeTakeFirstOrThrow(),
  ]);
  return { items: rows.map(toProject), total: Number(count.n) };
}

export async function getProject(db: DB, user: AppUser, id: string): Promise<Project> {
  const scope = scopeForUser(user);
  if (!isUuid(id)) throw new NotFoundError('No such project.');
  let query = baseQuery(db).where('p.id', '=', id);
  if (scope.organizationId) query = query.where('p.organization_id', '=', scope.organizationId);
  const row = await query.executeTakeFirst();
  if (!row) throw new NotFoundError('No such project, or it belongs to another company.');
  return toProject(row);
}

async function jurisdictionIdForSlug(db: DB, slug: string): Promise<string> {
  const j = await db.selectFrom('jurisdictions').select('id').where('slug', '=', slug).executeTakeFirst();
  if (!j) throw new ValidationError([{ path: 'jurisdiction', message: `Jurisdiction: no jurisdiction '${slug}'.` }]);
  return j.id;
}

export async function createProject(db: DB, user: AppUser, input: ProjectInput): Promise<Project> {
  if (user.role !== 'installer' || !user.organizationId) throw new ForbiddenError('Only installers create projects, for their own company.');
  const organizationId = user.organizationId;
  const id = await db.transaction().execute(async (trx) => {
    const jurisdictionId = await jurisdictionIdForSlug(trx, input.jurisdiction);
    const row = await trx
      .insertInto('projects')
      .values({
        organization_id: organizationId,
        jurisdiction_id: jurisdictionId,
        name: input.name,
        site_address: input.siteAddress,
        permit_number: input.permitNumber || null,
        notes: input.notes ?? '',
        created_by: user.id,
      })
      .returning('id')
      .executeTakeFirstOrThrow();
    await writeAudit(trx, { actorUserId: user.id, action: 'project.create', entityType: 'project', entityId: row.id, details: { name: input.name } });
    return row.id;
  });
  return getProject(db, user, id);
}

export async function updateProject(db: DB, user: AppUser, id: string, input: ProjectUpdateInput): Promise<Project> {
  const current = await getProject(db, user, id);
  await db.transaction().execute(async (trx) => {
    const set: Record<string, unknown> = { updated_at: new Date() };
    if (input.name !== undefined) set.name = input.name;
    if (input.siteAddress !== undefined) set.site_address = input.siteAddress;
    if (input.permitNumber !== undefined) set.permit_number = input.permitNumber || null;
    if (input.notes !== undefined) set.notes = input.notes;
    if (input.jurisdiction !== undefined) set.jurisdiction_id = await jurisdictionIdForSlug(trx, input.jurisdiction);
    if (input.archived !== undefined) set.archived_at = input.archived ? (current.archivedAt ?? new Date()) : null;
    await trx.updateTable('projects').set(set).where('id', '=', current.id).execute();
    const action = input.archived === true ? 'project.archive' : input.archived === false ? 'project.restore' : 'project.update';
    await writeAudit(trx, { actorUserId: user.id, action, entityType: 'project', entityId: current.id, details: { fields: Object.keys(input) } });
  });
  return getProject(db, user, id);
}
