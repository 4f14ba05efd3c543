import { z } from 'zod';
import { projectInputSchema } from '@/lib/domain/projects/schema';

/** A new job from an old closet: the copy's details (the source's where left out) and which plan revision to copy. */
export const projectDuplicateSchema = projectInputSchema
  .pick({ name: true, siteAddress: true, jurisdiction: true })
  .partial()
  .extend({
    revision: z.number().int('Revision: a whole number.').positive('Revision: 1 or more.').max(1_000_000).optional().describe('Plan revision to copy; the latest when left out'),
  });
export type ProjectDuplicateInput = z.infer<typeof projectDuplicateSchema>;

/** A quick check kept as a project: the project's details and the plan as entered. */
export const quickCheckSaveSchema = projectInputSchema.pick({ name: true, siteAddress: true, jurisdiction: true }).extend({
  plan: z.unknown().describe('The plan as entered'),
});
export type QuickCheckSaveInput = z.infer<typeof quickCheckSaveSchema>;

/** The copy's default name: "Copy of …", kept within the 120 characters a project name may have. */
export function copyName(name: string): string {
  const full = `Copy of ${name}`;
  return full.length <= 120 ? full : `${full.slice(0, 119)}…`;
}
