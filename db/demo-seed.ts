import type { DB } from '@/db/index';
import { demoAmendments, demoJurisdictions, demoOrganizations, demoPassword, demoProjects, demoUsers } from '@/db/demo';
import { demoPlans } from '@/db/demo-plans';
import { demoApplianceModels } from '@/db/demo-appliances';
import { toColumns } from '@/db/appliances';
import { toJurisdiction } from '@/db/jurisdictions';
import { createPublishedVersion } from '@/db/rule-sets';
import { parsePlan } from '@/lib/domain/plan';
import { PLAN_SCHEMA_VERSION } from '@/lib/domain/plan/upgrade';
import { buildRuleSet } from '@/rules';

/** How the seed hashes and checks passwords; the caller passes the app's own (db/ knows no platform code). */
export type PasswordHashing = {
  hashAtCurrentCost: (plain: string) => Promise<string>;
  needsRehash: (hash: string) => boolean;
  verifyPassword: (plain: string, hash: string) => Promise<boolean>;
};

/** Writes the invented demo scenario. Idempotent: a second run changes no rows. */
export async function writeDemoScenario(db: DB, { hashAtCurrentCost, needsRehash, verifyPassword }: PasswordHashing): Promise<void> {
  const password = demoPassword();
  await db.transaction().execute(async (trx) => {
    const orgIds = new Map<string, string>();
    for (const org of demoOrganizations) {
      const row = await trx
        .insertInto('organizations')
        .values({ name: org.name, license_number: org.license_number, is_demo: true })
        .onConflict((oc) => oc.column('name').doUpdateSet({ license_number: org.license_number, is_demo: true }))
        .returning('id')
        .executeTakeFirstOrThrow();
      orgIds.set(org.key, row.id);
    }

    const jurIds = new Map<string, string>();
    for (const j of demoJurisdictions) {
      const existing = await trx.selectFrom('jurisdictions').select('id').where('slug', '=', j.slug).executeTakeFirst();
      // An admin may have edited a demo jurisdiction; the seed only creates it.
      const id = existing?.id ?? (await trx.insertInto('jurisdictions').values(j).returning('id').executeTakeFirstOrThrow()).id;
      // Demo jurisdictions seeded before zones were stored got UTC from the migration; give them theirs.
      // A zone an admin chose (anything but that default) stays.
      if (existing && j.time_zone) {
        await trx.updateTable('jurisdictions').set({ time_zone: j.time_zone }).where('id', '=', id).where('is_demo', '=', true).where('time_zone', '=', 'UTC').execute();
      }
      jurIds.set(j.slug, id);
    }

    for (const u of demoUsers) {
      const organization_id = u.organization ? orgIds.get(u.organization)! : null;
      const jurisdiction_id = u.jurisdiction ? jurIds.get(u.jurisdiction)! : null;
      const existing = await trx.selectFrom('users').selectAll().where('email', '=', u.email).executeTakeFirst();
      if (!existing) {
        await trx
          .insertInto('users')
          .values({
            email: u.email,
            name: u.name,
            role: u.role,
            organization_id,
            jurisdiction_id,
            is_owner: !!u.owner,
            password_hash: await hashAtCurrentCost(password),
            is_demo: true,
          })
          .execute();
        continue;
      }
      // A hash from an older, cheaper cost is redone, so demo accounts time like real ones at sign-in.
      const passwordOk = (await verifyPassword(password, existing.password_hash)) && !needsRehash(existing.password_hash);
      const same =
        passwordOk && existing.name === u.name && existing.role === u.role &&
        existing.organization_id === organization_id && existing.jurisdiction_id === jurisdiction_id && existing.is_demo &&
        existing.is_owner === !!u.owner;
      if (same) continue;
      await trx
        .updateTable('users')
        .set({
          name: u.name,
          role: u.role,
          organization_id,
          jurisdiction_id,
          is_owner: !!u.owner,
          is_demo: true,
          updated_at: new Date(),
          ...(passwordOk ? {} : { password_hash: await hashAtCurrentCost(password) }),
        })
        .where('id', '=', existing.id)
        .execute();
    }
  });

  const admin = await db.selectFrom('users').select('id').where('email', '=', 'admin@nookpass.demo').executeTakeFirstOrThrow();
  for (const j of demoJurisdictions) {
    const row = await db.selectFrom('jurisdictions').selectAll().where('slug', '=', j.slug).executeTakeFirstOrThrow();
    const hasAny = await db.selectFrom('rule_sets').select('id').where('jurisdiction_id', '=', row.id).executeTakeFirst();
    if (hasAny) continue; // an admin's later versions are left alone
    const amendment = demoAmendments[j.slug];
    const built = buildRuleSet(toJurisdiction(row).editions, amendment?.overrides);
    await createPublishedVersion(db, {
      jurisdictionId: row.id,
      parameters: built.parameters,
      rules: built.rules,
      changelog: amendment?.changelog ?? 'Version 1 (demo).',
      actorUserId: admin.id,
    });
  }

  // The demo company's appliance library: each model is created once; installers' edits and deletions stand.
  const closetWorks = demoOrganizations.find((o) => o.key === 'closet-works')!;
  const closetWorksRow = await db.selectFrom('organizations').select('id').where('name', '=', closetWorks.name).executeTakeFirstOrThrow();
  const hasLibrary = await db.selectFrom('appliance_models').select('id').where('organization_id', '=', closetWorksRow.id).where('is_demo', '=', true).executeTakeFirst();
  if (!hasLibrary) {
    await db
      .insertInto('appliance_models')
      .values(demoApplianceModels.map((m) => ({ organization_id: closetWorksRow.id, ...toColumns(m), is_demo: true })))
      .execute();
  }

  for (const p of demoProjects) {
    const org = demoOrganizations.find((o) => o.key === p.organization)!;
    await db.transaction().execute(async (trx) => {
      const orgRow = await trx.selectFrom('organizations').select('id').where('name', '=', org.name).executeTakeFirstOrThrow();
      const exists = await trx.selectFrom('projects').select('id').where('organization_id', '=', orgRow.id).where('name', '=', p.name).executeTakeFirst();
      if (exists) return;
      const jur = await trx.selectFrom('jurisdictions').select('id').where('slug', '=', p.jurisdiction).executeTakeFirstOrThrow();
      const author = await trx
        .selectFrom('users')
        .select('id')
        .where('organization_id', '=', orgRow.id)
        .where('role', '=', 'installer')
        .orderBy('email')
        .executeTakeFirstOrThrow();
      const plan = demoPlans.find((d) => d.slug === p.plan)!.plan;
      const parsed = parsePlan(plan);
      if (!parsed.ok) throw new Error(`demo plan ${p.plan} does not parse: ${JSON.stringify(parsed.errors)}`);
      const project = await trx
        .insertInto('projects')
        .values({ organization_id: orgRow.id, jurisdiction_id: jur.id, name: p.name, site_address: p.siteAddress, is_demo: true, created_by: author.id })
        .returning('id')
        .executeTakeFirstOrThrow();
      await trx
        .insertInto('plan_revisions')
        .values({
          project_id: project.id,
          number: 1,
          plan: JSON.stringify(plan),
          canonical: JSON.stringify(parsed.plan),
          schema_version: PLAN_SCHEMA_VERSION,
          change_summary: 'First plan (demo)',
          created_by: author.id,
        })
        .execute();
    });
  }
}
