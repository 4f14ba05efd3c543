import { z } from 'zod';

/** One schema for the project form (react-hook-form + zodResolver) and the API. */
export const projectInputSchema = z.strictObject({
  name: z.string().trim().min(1, 'Name the project, e.g. "Hall closet, 14 Elm St".').max(120, 'Keep the name under 120 characters.')
    .describe('Project name'),
  siteAddress: z.string().trim().min(3, 'Give the site address the inspector will visit.').max(240, 'Keep the address under 240 characters.')
    .describe('Site address'),
  jurisdiction: z.string().trim().min(1, 'Choose the jurisdiction (AHJ) for the site.').describe('Jurisdiction slug'),
  permitNumber: z.string().trim().max(60, 'Keep the permit number under 60 characters.').optional().describe('Permit number, when issued'),
  notes: z.string().max(4000, 'Keep notes under 4000 characters.').optional().describe('Notes for the crew'),
});
export type ProjectInput = z.infer<typeof projectInputSchema>;

export const projectUpdateSchema = projectInputSchema.partial().extend({
  archived: z.boolean().optional().describe('Archive (true) or restore (false)'),
});
export type ProjectUpdateInput = z.infer<typeof projectUpdateSchema>;

export const projectSorts = ['updated', 'name', 'jurisdiction', 'created'] as const;

export const projectListQuerySchema = z.object({
  q: z.string().trim().max(120).optional(),
  sort: z.enum(projectSorts).default('updated'),
  dir: z.enum(['asc', 'desc']).default('desc'),
  // A million pages of a hundred is far past any company's projects, and keeps OFFSET inside bigint.
  page: z.coerce.number().int().min(1).max(1_000_000, 'Pages go up to 1,000,000.').default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(20),
  archived: z.enum(['0', '1', 'all']).default('0'),
});
export type ProjectListQuery = z.infer<typeof projectListQuerySchema>;
