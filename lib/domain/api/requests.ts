import { z } from 'zod';
import { applianceListQuerySchema } from '@/lib/domain/appliances/model';
import { positiveIntSchema } from '@/lib/domain/integers';

// Request bodies and queries of routes that have no form of their own; the routes parse with these and the
// OpenAPI description is generated from them.

export const evaluationRequestSchema = z.strictObject({
  jurisdiction: z.string().min(1, 'Give the jurisdiction slug, e.g. "demo-county".'),
  plan: z.unknown(),
  findings: z
    .enum(['all', 'failing'], { error: 'Ask for "all" findings (the default) or only the "failing" ones.' })
    .default('all')
    .describe('"failing" answers with the failing findings only; the summary still counts every finding.'),
});

export const planSaveRequestSchema = z.strictObject({ plan: z.unknown() });

export const checkRunRequestSchema = z.strictObject({
  revision: positiveIntSchema('The plan revision').optional().describe('Plan revision to check; the latest when left out.'),
});

export const attachmentUpdateSchema = z.strictObject({ caption: z.string().trim().max(300, 'Keep the caption under 300 characters.') });

export const applianceListRequestQuerySchema = applianceListQuerySchema.extend({ slot: z.enum(['washer', 'dryer']).optional() });
