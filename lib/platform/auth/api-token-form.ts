import { z } from 'zod';

/** Lifetimes the account page offers; the API takes any whole number of days up to a year. */
export const TOKEN_LIFETIME_CHOICES = [
  { days: 30, label: '30 days' },
  { days: 90, label: '90 days' },
  { days: 365, label: '1 year' },
] as const;
export const DEFAULT_TOKEN_DAYS = 90;
export const MAX_TOKEN_DAYS = 365;

export const newTokenSchema = z.strictObject({
  name: z.string().trim().min(1, 'Give the token a name, e.g. "office laptop".').max(80, 'Keep the name under 80 characters.'),
  expiresInDays: z
    .int('Give the lifetime in whole days.')
    .min(1, `Choose a lifetime of 1 to ${MAX_TOKEN_DAYS} days.`)
    .max(MAX_TOKEN_DAYS, `Choose a lifetime of 1 to ${MAX_TOKEN_DAYS} days.`)
    .default(DEFAULT_TOKEN_DAYS),
});
