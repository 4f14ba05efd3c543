import 'server-only';
import type { DB } from '@/db';
import {
  countApplianceModels,
  deleteApplianceModel,
  findApplianceModel,
  findApplianceModelByLabel,
  insertApplianceModel,
  listApplianceModels,
  updateApplianceModel,
} from '@/db/appliances';
import { writeAudit } from '@/db/audit';
import { parseApplianceCsv, serializeApplianceCsv } from '@/lib/domain/appliances/csv';
import {
  checkMerged,
  kindsFor,
  MAX_APPLIANCE_MODELS,
  type ApplianceListQuery,
  type ApplianceModel,
  type ApplianceModelValues,
  type ApplianceUpdate,
} from '@/lib/domain/appliances/model';
import { ForbiddenError, NotFoundError, ValidationError } from '@/lib/domain/errors';
import type { AppUser } from '@/lib/domain/roles';

/** The library belongs to an installer's company; nobody else reads or changes it. */
function companyOf(actor: AppUser): string {
  if (actor.role !== 'installer' || !actor.organizationId) throw new ForbiddenError('The appliance library belongs to installers’ companies.');
  return actor.organizationId;
}

function isUniqueViolation(err: unknown): boolean {
  return (err as { code?: string })?.code === '23505';
}

const duplicateLabel = (v: { kind: string; label: string }) =>
  new ValidationError([{ path: 'label', message: `Model label: the library already has a ${v.kind} labelled "${v.label}".` }]);

export async function listAppliances(db: DB, actor: AppUser, query: ApplianceListQuery & { slot?: 'washer' | 'dryer' } = {}): Promise<ApplianceModel[]> {
  const kinds = query.slot ? kindsFor(query.slot) : query.kind ? [query.kind] : undefined;
  return listApplianceModels(db, companyOf(actor), { kinds, q: query.q });
}

export async function getAppliance(db: DB, actor: AppUser, id: string): Promise<ApplianceModel> {
  const model = await findApplianceModel(db, companyOf(actor), id);
  if (!model) throw new NotFoundError('No such appliance model in your company’s library.');
  return model;
}

export async function createAppliance(db: DB, actor: AppUser, values: ApplianceModelValues): Promise<ApplianceModel> {
  const organizationId = companyOf(actor);
  if ((await countApplianceModels(db, organizationId)) >= MAX_APPLIANCE_MODELS) {
    throw new ValidationError([{ path: '(body)', message: `The library holds at most ${MAX_APPLIANCE_MODELS} models; delete some first.` }]);
  }
  try {
    return await db.transaction().execute(async (trx) => {
      const model = await insertApplianceModel(trx, { organizationId, values, createdBy: actor.id });
      await writeAudit(trx, { actorUserId: actor.id, action: 'appliance.create', entityType: 'appliance_model', entityId: model.id, details: { label: model.label }, organizationId });
      return model;
    });
  } catch (err) {
    if (isUniqueViolation(err)) throw duplicateLabel(values);
    throw err;
  }
}

export async function changeAppliance(db: DB, actor: AppUser, id: string, change: ApplianceUpdate): Promise<ApplianceModel> {
  const organizationId = companyOf(actor);
  const current = await getAppliance(db, actor, id);
  const merged = { ...current, ...change } as ApplianceModelValues;
  const errors = checkMerged(merged);
  if (errors.length) throw new ValidationError(errors);
  try {
    return await db.transaction().execute(async (trx) => {
      const model = await updateApplianceModel(trx, organizationId, current.id, merged);
      await writeAudit(trx, { actorUserId: actor.id, action: 'appliance.update', entityType: 'appliance_model', entityId: model.id, details: { fields: Object.keys(change) }, organizationId });
      return model;
    });
  } catch (err) {
    if (isUniqueViolation(err)) throw duplicateLabel(merged);
    throw err;
  }
}

/** Removes a model from the library. Plans that took figures from it keep their own copy, label included. */
export async function removeAppliance(db: DB, actor: AppUser, id: string): Promise<void> {
  const organizationId = companyOf(actor);
  const model = await getAppliance(db, actor, id);
  await db.transaction().execute(async (trx) => {
    if (!(await deleteApplianceModel(trx, organizationId, model.id))) throw new NotFoundError('No such appliance model in your company’s library.');
    await writeAudit(trx, { actorUserId: actor.id, action: 'appliance.delete', entityType: 'appliance_model', entityId: model.id, details: { label: model.label }, organizationId });
  });
}

export async function exportAppliancesCsv(db: DB, actor: AppUser): Promise<string> {
  return serializeApplianceCsv(await listApplianceModels(db, companyOf(actor)));
}

/**
 * Brings a CSV file into the library in one transaction: a row whose kind and label match a model already
 * there replaces its figures, any other row adds a model. One bad row and nothing of the file is saved; the
 * errors name each line and column.
 */
export async function importAppliancesCsv(db: DB, actor: AppUser, text: string): Promise<{ created: number; updated: number }> {
  const organizationId = companyOf(actor);
  const parsed = parseApplianceCsv(text);
  if (!parsed.ok) {
    throw new ValidationError(
      parsed.errors.map((e) => ({
        path: `csv.line.${e.line}${e.columnName ? `.${e.columnName}` : ''}`,
        message: `Line ${e.line}${e.column ? `, column ${e.column}` : ''}${e.columnName ? ` (${e.columnName})` : ''}: ${e.message}`,
        line: e.line,
        column: e.column,
        columnName: e.columnName,
      })),
    );
  }
  return db.transaction().execute(async (trx) => {
    let created = 0;
    let updated = 0;
    for (const { line: _line, ...values } of parsed.rows) {
      const existing = await findApplianceModelByLabel(trx, organizationId, values.kind, values.label);
      if (existing) {
        await updateApplianceModel(trx, organizationId, existing.id, values);
        updated += 1;
      } else {
        await insertApplianceModel(trx, { organizationId, values, createdBy: actor.id });
        created += 1;
      }
    }
    if ((await countApplianceModels(trx, organizationId)) > MAX_APPLIANCE_MODELS) {
      throw new ValidationError([{ path: 'csv', message: `The library would hold more than ${MAX_APPLIANCE_MODELS} models; nothing was imported.` }]);
    }
    await writeAudit(trx, { actorUserId: actor.id, action: 'appliance.import', entityType: 'appliance_model', details: { created, updated }, organizationId });
    return { created, updated };
  });
}
