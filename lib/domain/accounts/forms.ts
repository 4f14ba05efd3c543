import { z } from 'zod';
import { newPasswordSchema, withPasswordPolicy } from './password-policy';

// 64 + 1 + 255, the bound RFC 3696 section 3 first gave; the same bound sign-in reads.
export const MAX_EMAIL_LENGTH = 320;

export const emailSchema = z
  .string({ error: 'Enter your e-mail address.' })
  .trim()
  .min(1, 'Enter your e-mail address.')
  .max(MAX_EMAIL_LENGTH, `Keep the e-mail address under ${MAX_EMAIL_LENGTH} characters.`)
  .pipe(z.email('Enter an e-mail address like name@company.com.'))
  .transform((s) => s.toLowerCase());

const personName = z
  .string({ error: 'Enter your name.' })
  .trim()
  .min(1, 'Enter your name.')
  .max(120, 'Keep the name under 120 characters.');

const companyName = z
  .string({ error: 'Enter the company name.' })
  .trim()
  .min(2, 'Enter the company name as customers and inspectors know it.')
  .max(120, 'Keep the company name under 120 characters.');

/** Company sign-up: the company and its first person, who becomes its owner. */
export const signUpSchema = withPasswordPolicy(
  z.strictObject({ company: companyName, name: personName, email: emailSchema, password: newPasswordSchema }),
);
export type SignUpInput = z.infer<typeof signUpSchema>;

export const passwordResetRequestSchema = z.strictObject({ email: emailSchema });

/** Whether API tokens survive a password change or reset; the form asks, the default is to revoke them. */
const keepApiTokens = z.boolean().optional().default(false);

export const passwordResetSchema = z.strictObject({ password: newPasswordSchema, keepApiTokens });
export type PasswordResetInput = z.input<typeof passwordResetSchema>;

export const passwordChangeSchema = z.strictObject({
  currentPassword: z.string({ error: 'Enter your current password.' }).min(1, 'Enter your current password.').max(1024, 'That is not your current password.'),
  password: newPasswordSchema,
  keepApiTokens,
});
export type PasswordChangeInput = z.input<typeof passwordChangeSchema>;

/** The company details an owner keeps: printed on reports (licence) and used as defaults (jurisdiction). */
export const companySettingsSchema = z.strictObject({
  name: companyName,
  address: z.string().trim().max(300, 'Keep the address under 300 characters.').default(''),
  phone: z
    .string()
    .trim()
    .max(40, 'Keep the phone number under 40 characters.')
    .regex(/^[0-9+()./\s-]*(?:\s*(?:x|ext\.?)\s*[0-9]+)?$/i, 'Use digits, spaces and + ( ) - . only, e.g. +1 555-0100 ext. 12.')
    .default(''),
  licenseNumber: z.string().trim().max(60, 'Keep the licence number under 60 characters.').default(''),
  defaultJurisdiction: z.string().trim().max(80).default('').describe('Jurisdiction slug preselected for new projects, or empty'),
});
export type CompanySettingsInput = z.input<typeof companySettingsSchema>;
