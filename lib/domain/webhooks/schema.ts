import { z } from 'zod';
import { WEBHOOK_EVENT_TYPES } from '@/lib/domain/webhooks/events';

export const MAX_WEBHOOK_URL_LENGTH = 2000;
/** Endpoints per company: enough for a few integrations, not a fan-out. */
export const MAX_WEBHOOK_ENDPOINTS = 10;

/**
 * What an address must look like anywhere: http or https, a host, no user name or password in it (it would be
 * shown on the page), no fragment (never sent). Whether plain http or a local address is allowed depends on
 * where NookPass runs and is decided by the service.
 */
export function webhookUrlShapeProblem(text: string): string | null {
  let url: URL;
  try {
    url = new URL(text);
  } catch {
    return 'Enter the full address of the endpoint, starting with https://.';
  }
  if (url.protocol !== 'https:' && url.protocol !== 'http:') return 'The address must start with https://.';
  if (!url.hostname) return 'The address needs a host name.';
  if (url.username || url.password) return 'Leave the user name and password out of the address; every delivery is signed instead.';
  if (url.hash) return 'Leave the #fragment out of the address; it is never sent.';
  return null;
}

const urlSchema = z
  .string({ error: 'Enter the endpoint address, starting with https://.' })
  .trim()
  .min(1, 'Enter the endpoint address, starting with https://.')
  .max(MAX_WEBHOOK_URL_LENGTH, `Keep the address under ${MAX_WEBHOOK_URL_LENGTH} characters.`)
  .superRefine((text, ctx) => {
    const problem = webhookUrlShapeProblem(text);
    if (problem) ctx.addIssue({ code: 'custom', message: problem });
  })
  .describe('HTTPS address that receives the deliveries (POST, JSON). Plain http is accepted only for a local receiver outside production.');

const eventsSchema = z
  .array(z.enum(WEBHOOK_EVENT_TYPES, { error: `Choose from ${WEBHOOK_EVENT_TYPES.join(', ')}.` }), { error: 'Choose the events to receive.' })
  .min(1, 'Choose at least one event.')
  .max(WEBHOOK_EVENT_TYPES.length, 'Each event once.')
  .transform((events) => [...new Set(events)])
  .describe('The events this endpoint receives.');

export const webhookCreateSchema = z.strictObject({ url: urlSchema, events: eventsSchema });
export type WebhookCreateInput = z.input<typeof webhookCreateSchema>;
export type WebhookCreateOutput = z.output<typeof webhookCreateSchema>;

export const webhookUpdateSchema = z
  .strictObject({
    url: urlSchema.optional(),
    events: eventsSchema.optional(),
    active: z.boolean('active is true or false.').optional().describe('false stops deliveries to the endpoint; true resumes them.'),
  })
  .refine((v) => v.url !== undefined || v.events !== undefined || v.active !== undefined, { message: 'Change url, events or active.', path: ['(body)'] });
export type WebhookUpdateInput = z.output<typeof webhookUpdateSchema>;

export const webhookDeliveriesQuerySchema = z.strictObject({
  limit: z.coerce.number('limit is a whole number.').int('limit is a whole number.').min(1, 'limit is at least 1.').max(100, 'limit is at most 100.').default(20).describe('How many of the latest deliveries (default 20, at most 100).'),
});
