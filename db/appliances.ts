import { sql, type Selectable } from 'kysely';
import type { DB } from '@/db/index';
import type { ApplianceModelsTable } from '@/db/types';
import type { ApplianceKind, ApplianceModel, ApplianceModelValues } from '@/lib/domain/appliances/model';
import { isUuid } from '@/lib/domain/ids';

type Row = Selectable<ApplianceModelsTable>;

function toModel(r: Row): ApplianceModel {
  return {
    id: r.id,
    kind: r.kind,
    label: r.label,
    widthIn: r.width_in,
    depthIn: r.depth_in,
    heightIn: r.height_in,
    frontProjectionIn: r.front_projection_in,
    clearanceSideIn: r.clearance_side_in,
    clearanceTopIn: r.clearance_top_in,
    clearanceRearIn: r.clearance_rear_in,
    clearanceFrontIn: r.clearance_front_in,
    closetVentTopSqIn: r.closet_vent_top_sq_in,
    closetVentBottomSqIn: r.closet_vent_bottom_sq_in,
    maxExhaustLengthIn: r.max_exhaust_length_in,
    fuel: r.fuel,
    dryerType: r.dryer_type,
    exhaustCfm: r.exhaust_cfm,
    volts: r.volts,
    amps: r.amps,
    isDemo: r.is_demo,
    createdAt: r.created_at,
    updatedAt: r.updated_at,
  };
}

/** A model's values as table columns. */
export function toColumns(v: ApplianceModelValues) {
  return {
    kind: v.kind,
    label: v.label,
    width_in: v.widthIn,
    depth_in: v.depthIn,
    height_in: v.heightIn,
    front_projection_in: v.frontProjectionIn,
    clearance_side_in: v.clearanceSideIn,
    clearance_top_in: v.clearanceTopIn,
    clearance_rear_in: v.clearanceRearIn,
    clearance_front_in: v.clearanceFrontIn,
    closet_vent_top_sq_in: v.closetVentTopSqIn,
    closet_vent_bottom_sq_in: v.closetVentBottomSqIn,
    max_exhaust_length_in: v.maxExhaustLengthIn,
    fuel: v.fuel,
    dryer_type: v.dryerType,
    exhaust_cfm: v.exhaustCfm,
    volts: v.volts,
    amps: v.amps,
  };
}

export async function listApplianceModels(
  db: DB,
  organizationId: string,
  filter: { kinds?: readonly ApplianceKind[]; q?: string } = {},
): Promise<ApplianceModel[]> {
  let query = db.selectFrom('appliance_models').selectAll().where('organization_id', '=', organizationId);
  if (filter.kinds?.length) query = query.where('kind', 'in', [...filter.kinds]);
  if (filter.q) query = query.where('label', 'ilike', `%${filter.q.replace(/[\\%_]/g, (c) => '\\' + c)}%`);
  const rows = await query.orderBy('kind').orderBy(sql`lower(label)`).orderBy('id').execute();
  return rows.map(toModel);
}

export async function countApplianceModels(db: DB, organizationId: string): Promise<number> {
  const row = await db.selectFrom('appliance_models').select(sql<string>`count(*)`.as('n')).where('organization_id', '=', organizationId).executeTakeFirstOrThrow();
  return Number(row.n);
}

/** The company's model, or null when there is none with that id in this company. */
export async function findApplianceModel(db: DB, organizationId: string, id: string): Promise<ApplianceModel | null> {
  if (!isUuid(id)) return null;
  const row = await db.selectFrom('appliance_models').selectAll().where('id', '=', id).where('organization_id', '=', organizationId).executeTakeFirst();
  return row ? toModel(row) : null;
}

export async function findApplianceModelByLabel(db: DB, organizationId: string, kind: ApplianceKind, label: string): Promise<ApplianceModel | null> {
  const row = await db
    .selectFrom('appliance_models')
    .selectAll()
    .where('organization_id', '=', organizationId)
    .where('kind', '=', kind)
    .where(sql`lower(label)`, '=', label.toLowerCase())
    .executeTakeFirst();
  return row ? toModel(row) : null;
}

export async function insertApplianceModel(
  db: DB,
  input: { organizationId: string; values: ApplianceModelValues; createdBy: string | null; isDemo?: boolean },
): Promise<ApplianceModel> {
  const row = await db
    .insertInto('appliance_models')
    .values({ organization_id: input.organizationId, ...toColumns(input.values), created_by: input.createdBy, is_demo: input.isDemo ?? false })
    .returningAll()
    .executeTakeFirstOrThrow();
  return toModel(row);
}

export async function updateApplianceModel(db: DB, organizationId: string, id: string, values: ApplianceModelValues): Promise<ApplianceModel> {
  const row = await db
    .updateTable('appliance_models')
    .set({ ...toColumns(values), updated_at: new Date() })
    .where('id', '=', id)
    .where('organization_id', '=', organizationId)
    .returningAll()
    .executeTakeFirstOrThrow();
  return toModel(row);
}

export async function deleteApplianceModel(db: DB, organizationId: string, id: string): Promise<boolean> {
  const result = await db.deleteFrom('appliance_models').where('id', '=', id).where('organization_id', '=', organizationId).executeTakeFirst();
  return Number(result.numDeletedRows) > 0;
}
