import type { DB } from '@/db/index';
import { writeAudit } from '@/db/audit';
import type { JurisdictionRow, NewJurisdiction } from '@/db/types';
import type { Editions } from '@/lib/domain/editions';
import { NotFoundError, ValidationError } from '@/lib/domain/errors';

export type JurisdictionEditions = Editions;

export type Jurisdiction = {
  id: string;
  slug: string;
  name: string;
  region: string;
  editions: JurisdictionEditions;
  inspectorEmail: string | null;
  amendmentNotes: string;
  /** IANA zone; every date shown for the jurisdiction goes through lib/domain/dates/format in it. */
  timeZone: string;
  isDemo: boolean;
};

export function toJurisdiction(row: JurisdictionRow): Jurisdiction {
  return {
    id: row.id,
    slug: row.slug,
    name: row.name,
    region: row.region,
    editions: {
      building: row.building_edition,
      electrical: row.electrical_edition,
      plumbing: row.plumbing_edition,
      plumbingFamily: row.plumbing_family,
      mechanical: row.mechanical_edition,
      fuelGas: row.fuel_gas_edition,
    },
    inspectorEmail: row.inspector_email,
    amendmentNotes: row.amendment_notes,
    timeZone: row.time_zone,
    isDemo: row.is_demo,
  };
}

export async function listJurisdictions(db: DB): Promise<Jurisdiction[]> {
  const rows = await db.selectFrom('jurisdictions').selectAll().orderBy('name').execute();
  return rows.map(toJurisdiction);
}

export async function findJurisdictionBySlug(db: DB, slug: string): Promise<Jurisdiction | null> {
  const row = await db.selectFrom('jurisdictions').selectAll().where('slug', '=', slug).executeTakeFirst();
  return row ? toJurisdiction(row) : null;
}

export async function findJurisdictionById(db: DB, id: string): Promise<Jurisdiction | null> {
  const row = await db.selectFrom('jurisdictions').selectAll().where('id', '=', id).executeTakeFirst();
  return row ? toJurisdiction(row) : null;
}

export type JurisdictionFields = {
  name: string;
  region: string;
  editions: JurisdictionEditions;
  inspectorEmail: string | null;
  amendmentNotes: string;
  timeZone?: string;
};

function toColumns(fields: Partial<JurisdictionFields>) {
  return {
    ...(fields.name !== undefined ? { name: fields.name } : {}),
    ...(fields.region !== undefined ? { region: fields.region } : {}),
    ...(fields.editions
      ? {
          building_edition: fields.editions.building,
          electrical_edition: fields.editions.electrical,
          plumbing_edition: fields.editions.plumbing,
          plumbing_family: fields.editions.plumbingFamily,
          mechanical_edition: fields.editions.mechanical,
          fuel_gas_edition: fields.editions.fuelGas,
        }
      : {}),
    ...(fields.inspectorEmail !== undefined ? { inspector_email: fields.inspectorEmail } : {}),
    ...(fields.amendmentNotes !== undefined ? { amendment_notes: fields.amendmentNotes } : {}),
    ...(fields.timeZone !== undefined ? { time_zone: fields.timeZone } : {}),
  };
}

/** Inserts a jurisdiction; a taken slug is a field error, not a 500. Run it inside the caller's transaction. */
export async function insertJurisdiction(db: DB, input: JurisdictionFields & { slug: string }): Promise<Jurisdiction> {
  const taken = await db.selectFrom('jurisdictions').select('id').where('slug', '=', input.slug).executeTakeFirst();
  if (taken) throw new ValidationError([{ path: 'slug', message: `'${input.slug}' is already used by another jurisdiction.` }]);
  const row = await db
    .insertInto('jurisdictions')
    .values({ slug: input.slug, ...toColumns(input), updated_at: new Date() } as NewJurisdiction)
    .returningAll()
    .executeTakeFirstOrThrow();
  return toJurisdiction(row);
}

/** Updates the given fields and records what changed (before and after) in the audit log. */
export async function updateJurisdiction(db: DB, id: string, fields: Partial<JurisdictionFields>, actorUserId: string): Promise<Jurisdiction> {
  return db.transaction().execute(async (trx) => {
    const before = await trx.selectFrom('jurisdictions').selectAll().where('id', '=', id).forUpdate().executeTakeFirst();
    if (!before) throw new NotFoundError('No such jurisdiction.');
    const columns = toColumns(fields);
    const changed = Object.fromEntries(
      Object.entries(columns).filter(([k, v]) => (before as Record<string, unknown>)[k] !== v).map(([k, v]) => [k, { from: (before as Record<string, unknown>)[k], to: v }]),
    );
    const row = Object.keys(changed).length
      ? await trx.updateTable('jurisdictions').set({ ...columns, updated_at: new Date() }).where('id', '=', id).returningAll().executeTakeFirstOrThrow()
      : before;
    await writeAudit(trx, { actorUserId, action: 'jurisdiction.update', entityType: 'jurisdiction', entityId: id, details: { jurisdictionId: id, changed } });
    return toJurisdiction(row);
  });
}

export type JurisdictionOverview = Jurisdiction & {
  published: { id: string; version: number; publishedAt: Date | null } | null;
  draft: { id: string; version: number; updatedAt: Date } | null;
  versions: number;
  projects: number;
};

export async function listJurisdictionOverview(db: DB): Promise<JurisdictionOverview[]> {
  const [list, sets, projects] = await Promise.all([
    listJurisdictions(db),
    db.selectFrom('rule_sets').select(['id', 'jurisdiction_id', 'version', 'status', 'published_at', 'updated_at']).execute(),
    db
      .selectFrom('projects')
      .select((eb) => ['jurisdiction_id', eb.fn.countAll<number>().as('n')])
      .where('archived_at', 'is', null)
      .groupBy('jurisdiction_id')
      .execute(),
  ]);
  return list.map((j) => {
    const mine = sets.filter((s) => s.jurisdiction_id === j.id);
    const pub = mine.find((s) => s.status === 'published');
    const draft = mine.find((s) => s.status === 'draft');
    return {
      ...j,
      published: pub ? { id: pub.id, version: pub.version, publishedAt: pub.published_at } : null,
      draft: draft ? { id: draft.id, version: draft.version, updatedAt: draft.updated_at } : null,
      versions: mine.length,
      projects: Number(projects.find((p) => p.jurisdiction_id === j.id)?.n ?? 0),
    };
  });
}

/** Has the jurisdiction an active inspector account in NookPass (someone who reads its queue)? */
export async function jurisdictionHasInspectors(db: DB, jurisdictionId: string): Promise<boolean> {
  const row = await db
    .selectFrom('users')
    .select('id')
    .where('role', '=', 'inspector')
    .where('jurisdiction_id', '=', jurisdictionId)
    .where('deactivated_at', 'is', null)
    .limit(1)
    .executeTakeFirst();
  return !!row;
}
