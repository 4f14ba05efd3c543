import { z } from 'zod';

export const MAX_FINDING_KEY_LENGTH = 200;
/** More than any rule set has rules. */
export const MAX_FINDING_COMMENTS = 300;

/** The inspector's outcome form and the API share this schema. */
export const reviewSchema = z
  .strictObject({
    outcome: z.enum(['approved', 'corrections-needed'], 'Choose approved or corrections needed.'),
    comment: z.string().trim().max(4000, 'Keep the comment under 4000 characters.').default(''),
    // Keyed by any finding of the reported check, passed ones too; which keys exist is the check's to say,
    // so the service answers an unknown key by name.
    findingComments: z
      .record(z.string().min(1, 'A finding key is empty.').max(MAX_FINDING_KEY_LENGTH, `A finding key has at most ${MAX_FINDING_KEY_LENGTH} characters.`), z.string().trim().max(2000, 'Keep each comment under 2000 characters.'))
      .refine((r) => Object.keys(r).length <= MAX_FINDING_COMMENTS, `Comment on at most ${MAX_FINDING_COMMENTS} findings.`)
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
