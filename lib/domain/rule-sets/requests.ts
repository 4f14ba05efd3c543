import { z } from 'zod';
import { positiveIntSchema } from '@/lib/domain/integers';
import { ruleSetParametersSchema } from '@/lib/domain/params';

const revision = z.number({ error: 'Send the draft revision you loaded.' }).pipe(positiveIntSchema('The draft revision'));

/** Where a new draft comes from. */
export const draftCreateSchema = z
  .object({
    from: z.enum(['published', 'baseline', 'version']).describe('published copy, model-code baseline, or a given version'),
    ruleSetId: z.uuid().optional(),
  })
  .strict()
  .refine((v) => v.from !== 'version' || !!v.ruleSetId, { path: ['ruleSetId'], message: 'Pick the version to copy.' });

export const draftSaveSchema = z
  .object({ revision, parameters: ruleSetParametersSchema.optional(), changelog: z.string().max(4000).optional() })
  .strict();

export const ruleSaveSchema = z.object({ revision, rule: z.unknown() }).strict();

export const publishSchema = z
  .object({
    revision,
    changelog: z.string().trim().min(1, 'Write a changelog note: what changed and why (e.g. the local amendment it records).').max(4000),
    // Publishes although from-memory citations are not yet checked against the adopted text.
    confirm: z.boolean().optional(),
  })
  .strict();

export const retireSchema = z
  .object({
    successorId: z.uuid({ error: 'Pick the draft that replaces this version; a published version is only retired when a successor is published in its place.' }),
    revision,
    changelog: z.string().trim().min(1, 'Write the changelog note for the successor.').max(4000),
    confirm: z.boolean().optional(),
  })
  .strict();

export const revisionQuerySchema = z.object({
  revision: z.coerce.number({ error: 'Send the draft revision you loaded (?revision=<n>).' }).pipe(positiveIntSchema('The draft revision')),
});

/** Starts a dry run as a job; `revision`, when sent, is the draft revision the admin sees (409 if it moved on). */
export const dryRunStartSchema = z.object({ revision: revision.optional() }).strict();

/** Starts an impact run as a job; `version`, when sent, is the published version the admin expects (409 if another is published). */
export const impactRunStartSchema = z
  .object({ version: z.number({ error: 'Send the published version you expect.' }).pipe(positiveIntSchema('The version')).optional() })
  .strict();
