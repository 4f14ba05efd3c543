import { z } from 'zod';
import { canonicalTimeZone } from '@/lib/domain/dates/format';

/** An IANA time zone as a jurisdiction stores it; an unknown name is a field error, stored in its listed spelling. */
export const timeZoneSchema = z
  .string({ error: 'Choose the time zone, e.g. America/Denver.' })
  .trim()
  .min(1, 'Choose the time zone, e.g. America/Denver.')
  .max(64, 'Use an IANA time zone name, e.g. America/Denver.')
  .transform((value, ctx) => {
    const zone = canonicalTimeZone(value);
    if (zone) return zone;
    ctx.addIssue({ code: 'custom', message: `'${value}' is not a time zone this server knows. Use an IANA name, e.g. America/Denver, America/St_Johns or UTC.` });
    return z.NEVER;
  })
  .describe('IANA time zone (e.g. America/Denver); dates for the jurisdiction are shown in it.');
