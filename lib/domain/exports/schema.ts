import { projectListQuerySchema } from '@/lib/domain/projects/schema';

/** The projects list's own filters and order; the export has no pages, it holds every matching project. */
export const projectExportQuerySchema = projectListQuerySchema.omit({ page: true, pageSize: true });
