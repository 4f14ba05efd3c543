import { z } from 'zod';
import { editionsSchema } from '@/lib/domain/editions';
import { editionConsistencyErrors } from '@/lib/domain/edition-consistency';
import { timeZoneSchema } from '@/lib/domain/dates/time-zone-schema';

const optionalEmail = z.preprocess(
  (value) => (typeof value === 'string' && value.trim() === '' ? null : value),
  z.email('Enter an e-mail address, e.g. permits@example.gov, or leave it empty.').nullable(),
);

// Checked when a jurisdiction is saved, not in editionsSchema itself: stored rule sets keep the editions
// they were written with and must still read.
const consistentEditions = editionsSchema.superRefine((editions, ctx) => {
  for (const e of editionConsistencyErrors(editions, '')) ctx.addIssue({ code: 'custom', path: [e.path], message: e.message });
});

const fields = {
  name: z.string().trim().min(1, 'Give the jurisdiction a name.').max(120),
  region: z.string().trim().min(1, 'Name the state or region.').max(120),
  editions: consistentEditions,
  inspectorEmail: optionalEmail,
  amendmentNotes: z.string().max(4000, 'Keep the notes under 4000 characters.'),
  timeZone: timeZoneSchema,
};

/** Creating a jurisdiction: its identity, adopted editions, and where its first draft comes from. */
export const jurisdictionCreateSchema = z
  .object({
    slug: z
      .string()
      .trim()
      .regex(/^[a-z0-9]+(-[a-z0-9]+)*$/, 'Use lower-case letters, digits and single hyphens, e.g. north-county.')
      .max(60),
    ...fields,
    // Left out, the jurisdiction starts on UTC; an admin sets its own zone here or later.
    timeZone: timeZoneSchema.optional(),
    // 'baseline' = the model codes for the adopted editions; otherwise another jurisdiction's slug.
    startFrom: z.string().trim().min(1, 'Choose where the first draft comes from.'),
    // Set to publish the starting rules unchanged at once, with this changelog note.
    publishChangelog: z.string().trim().min(1, 'Write the changelog note for the first version.').max(4000).optional(),
    // With publishChangelog: publishes although its from-memory citations are not yet checked.
    confirm: z.boolean().optional(),
  })
  .strict();

export const jurisdictionUpdateSchema = z.object(fields).partial().strict();

export type JurisdictionCreateInput = z.infer<typeof jurisdictionCreateSchema>;
export type JurisdictionUpdateInput = z.infer<typeof jurisdictionUpdateSchema>;

/** One entry of `GET /api/jurisdictions`, as the route builds it and the OpenAPI document describes it. */
export const jurisdictionListItemSchema = z
  .object({
    slug: z.string(),
    name: z.string(),
    region: z.string(),
    editions: z.object({ building: z.string(), electrical: z.string(), plumbing: z.string(), plumbingFamily: z.string(), mechanical: z.string(), fuelGas: z.string() }),
    timeZone: z.string().describe('IANA time zone (e.g. America/Denver) in which the jurisdiction’s dates are shown.'),
    publishedVersion: z.number().int().nullable(),
  })
  .meta({ id: 'JurisdictionListItem' });

export type JurisdictionListItem = z.infer<typeof jurisdictionListItemSchema>;
