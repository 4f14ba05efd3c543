import { Kysely, sql } from 'kysely';

// Frozen in time: this file never imports app code.
//
// A company's appliance library: the models its installers pick into plans. Sizes are canonical inches,
// areas square inches. A plan keeps its own copy of what it took from a model, so a model can be edited or
// deleted without touching any plan revision.
export async function up(db: Kysely<any>): Promise<void> {
  const length = (name: string) => sql`${sql.ref(name)} IS NULL OR (${sql.ref(name)} >= 0 AND ${sql.ref(name)} < 1000)`;
  await db.schema
    .createTable('appliance_models')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('organization_id', 'uuid', (c) => c.notNull().references('organizations.id').onDelete('cascade'))
    .addColumn('kind', 'text', (c) => c.notNull().check(sql`kind IN ('washer', 'dryer', 'washer-dryer')`))
    .addColumn('label', 'text', (c) => c.notNull().check(sql`length(trim(label)) BETWEEN 1 AND 120`))
    .addColumn('width_in', 'double precision', (c) => c.notNull().check(sql`width_in > 0 AND width_in < 1000`))
    .addColumn('depth_in', 'double precision', (c) => c.notNull().check(sql`depth_in > 0 AND depth_in < 1000`))
    .addColumn('height_in', 'double precision', (c) => c.notNull().check(sql`height_in > 0 AND height_in < 1000`))
    .addColumn('front_projection_in', 'double precision', (c) => c.check(length('front_projection_in')))
    .addColumn('clearance_side_in', 'double precision', (c) => c.check(length('clearance_side_in')))
    .addColumn('clearance_top_in', 'double precision', (c) => c.check(length('clearance_top_in')))
    .addColumn('clearance_rear_in', 'double precision', (c) => c.check(length('clearance_rear_in')))
    .addColumn('clearance_front_in', 'double precision', (c) => c.check(length('clearance_front_in')))
    .addColumn('closet_vent_top_sq_in', 'double precision', (c) => c.check(sql`closet_vent_top_sq_in IS NULL OR closet_vent_top_sq_in >= 0`))
    .addColumn('closet_vent_bottom_sq_in', 'double precision', (c) => c.check(sql`closet_vent_bottom_sq_in IS NULL OR closet_vent_bottom_sq_in >= 0`))
    .addColumn('max_exhaust_length_in', 'double precision', (c) => c.check(sql`max_exhaust_length_in IS NULL OR max_exhaust_length_in > 0`))
    .addColumn('fuel', 'text', (c) => c.check(sql`fuel IS NULL OR fuel IN ('electric', 'gas')`))
    .addColumn('dryer_type', 'text', (c) => c.check(sql`dryer_type IS NULL OR dryer_type IN ('vented', 'condensing', 'heat-pump')`))
    .addColumn('exhaust_cfm', 'double precision', (c) => c.check(sql`exhaust_cfm IS NULL OR exhaust_cfm >= 0`))
    .addColumn('volts', 'integer', (c) => c.check(sql`volts IS NULL OR volts > 0`))
    .addColumn('amps', 'integer', (c) => c.check(sql`amps IS NULL OR amps > 0`))
    .addColumn('is_demo', 'boolean', (c) => c.notNull().defaultTo(false))
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  // One label per kind within a company, so an import or a picker never meets two models of one name.
  await sql`CREATE UNIQUE INDEX appliance_models_org_kind_label_unique ON appliance_models (organization_id, kind, lower(label))`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('appliance_models').execute();
}
