import type { DB } from '@/db/index';
import { findCheck } from '@/db/checks';
import { listProjects } from '@/db/projects';
import { NotFoundError } from '@/lib/domain/errors';
import type { ProjectListQuery } from '@/lib/domain/projects/schema';
import type { AppUser } from '@/lib/domain/roles';
import { csvFileName, findingsCsv, projectsCsv, type ProjectExportRow } from '@/lib/domain/exports/csv';

const PAGE = 100;
/** Ten thousand rows is a large company's whole history; a bigger export is cut there and says so in its file name. */
export const MAX_EXPORT_PROJECTS = 10_000;

/** Every project the list would show with these filters (all pages), in the list's order. */
export async function exportProjectsCsv(db: DB, user: AppUser, q: Omit<ProjectListQuery, 'page' | 'pageSize'>): Promise<{ csv: string; fileName: string }> {
  const rows: ProjectExportRow[] = [];
  let total = 0;
  for (let page = 1; rows.length < MAX_EXPORT_PROJECTS; page++) {
    const result = await listProjects(db, user, { ...q, page, pageSize: PAGE });
    total = result.total;
    rows.push(...result.items);
    if (result.items.length < PAGE) break;
  }
  const kept = rows.slice(0, MAX_EXPORT_PROJECTS);
  const day = new Date().toISOString().slice(0, 10);
  return { csv: projectsCsv(kept), fileName: csvFileName('projects', day, total > kept.length ? `first-${kept.length}` : '') };
}

export async function exportFindingsCsv(db: DB, user: AppUser, checkId: string): Promise<{ csv: string; fileName: string }> {
  const check = await findCheck(db, user, checkId);
  if (!check) throw new NotFoundError('No such check, or its project belongs to another company.');
  return { csv: findingsCsv(check.findings), fileName: csvFileName('check', check.ruleSet.jurisdiction, `v${check.ruleSet.version}`, check.createdAt.toISOString().slice(0, 10), 'findings') };
}
