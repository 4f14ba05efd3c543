import { z } from 'zod';

/** The inspector's outcome form and the API share this schema. */
export const reviewSchema = z
  .strictObject({
    outcome: z.enum(['approved', 'corrections-needed'], 'Choose approved or corrections needed.'),
    comment: z.string().trim().max(4000, 'Keep the comment under 4000 characters.').default(''),
    findingComments: z
      .record(z.string().regex(/^[a-z0-9-]+(\.[a-z0-9-]+)+$/, 'Unknown rule key.'), z.string().trim().max(2000, 'Keep each comment under 2000 characters.'))
      .default({}),
    // Recording over a standing outcome must say so: either flag, or the id of the outcome replaced.
    revise: z.boolean('revise is true or false.').optional().describe('Revise the outcome already recorded.'),
    revises: z.uuid('revises is the id of the outcome being revised.').optional(),
  })
  .refine((r) => r.outcome === 'approved' || r.comment.length > 0 || Object.values(r.findingComments).some((c) => c.length > 0), {
    message: 'Say what needs correcting: a general comment or a comment on a finding.',
    path: ['comment'],
  });
export type ReviewInput = z.infer<typeof reviewSchema>;
export type ReviewOutcome = ReviewInput['outcome'];
