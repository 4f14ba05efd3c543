import { z } from 'zod';
import type { FieldError } from '../errors';

/**
 * At least 12 characters (OWASP ASVS 4.0.3 V2.1.1), no upper bound worth noticing (V2.1.2 asks that 64 or
 * more be allowed; bcrypt reads only the first 72 bytes, which a longer password still fills).
 */
export const MIN_NEW_PASSWORD_LENGTH = 12;
export const MAX_NEW_PASSWORD_LENGTH = 1024;

export const PASSWORD_TOO_SHORT = `Use at least ${MIN_NEW_PASSWORD_LENGTH} characters; a short sentence is easy to remember.`;
export const PASSWORD_TOO_LONG = `Use at most ${MAX_NEW_PASSWORD_LENGTH} characters.`;
export const PASSWORD_IS_EMAIL = 'Your password cannot be your e-mail address (or the part before the @); choose something else.';

/** A new password's length rule, for a form that does not know the e-mail (the server adds the e-mail rule). */
export const newPasswordSchema = z
  .string({ error: 'Enter a password.' })
  .min(MIN_NEW_PASSWORD_LENGTH, PASSWORD_TOO_SHORT)
  .max(MAX_NEW_PASSWORD_LENGTH, PASSWORD_TOO_LONG);

function comparable(text: string): string {
  return text.trim().toLowerCase();
}

/** Why this password may not be used by the person with this e-mail, or null when it may. */
export function passwordProblem(password: string, email: string | null | undefined): string | null {
  if (password.length < MIN_NEW_PASSWORD_LENGTH) return PASSWORD_TOO_SHORT;
  if (password.length > MAX_NEW_PASSWORD_LENGTH) return PASSWORD_TOO_LONG;
  if (email) {
    const address = comparable(email);
    const local = address.split('@')[0];
    const candidate = comparable(password);
    if (candidate === address || (local.length > 0 && candidate === local)) return PASSWORD_IS_EMAIL;
  }
  return null;
}

/** The same rule as a field error at `path` (400 body shape), or null. */
export function passwordFieldError(password: string, email: string | null | undefined, path = 'password'): FieldError | null {
  const message = passwordProblem(password, email);
  return message ? { path, message } : null;
}

/**
 * Adds the e-mail rule to a form schema that has both an `email` and a `password` field, so the browser
 * (zodResolver) and the route handler refuse the same passwords with the same words beside the field.
 */
export function withPasswordPolicy<S extends z.ZodType<{ email: string; password: string }>>(schema: S) {
  return schema.superRefine((value, ctx) => {
    if (typeof value?.password !== 'string' || typeof value?.email !== 'string') return;
    const message = passwordProblem(value.password, value.email);
    if (message && message !== PASSWORD_TOO_SHORT && message !== PASSWORD_TOO_LONG) {
      ctx.addIssue({ code: 'custom', path: ['password'], message });
    }
  });
}
