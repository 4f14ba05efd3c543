import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import {
  MIN_NEW_PASSWORD_LENGTH,
  PASSWORD_IS_EMAIL,
  PASSWORD_TOO_SHORT,
  newPasswordSchema,
  passwordFieldError,
  passwordProblem,
  withPasswordPolicy,
} from '@/lib/domain/accounts/password-policy';

describe('new password policy', () => {
  it('asks for at least 12 characters', () => {
    expect(MIN_NEW_PASSWORD_LENGTH).toBe(12); // OWASP ASVS 4.0.3 V2.1.1
    expect(passwordProblem('a'.repeat(11), null)).toBe(PASSWORD_TOO_SHORT);
    expect(passwordProblem('a'.repeat(12), null)).toBeNull();
    expect(newPasswordSchema.safeParse('elevenchars').success).toBe(false);
    expect(newPasswordSchema.safeParse('twelve chars').success).toBe(true);
  });

  it('refuses the e-mail address itself, whatever its case or spaces, and its local part', () => {
    expect(passwordProblem('Pat.Long-Name@Example.test', 'pat.long-name@example.test')).toBe(PASSWORD_IS_EMAIL);
    expect(passwordProblem('  pat.long-name@example.test ', 'pat.long-name@example.test')).toBe(PASSWORD_IS_EMAIL);
    expect(passwordProblem('a-much-longer-local-part', 'a-much-longer-local-part@example.test')).toBe(PASSWORD_IS_EMAIL);
    expect(passwordProblem('pat.long-name@example.test!', 'pat.long-name@example.test')).toBeNull();
  });

  it('puts the reason beside the password field', () => {
    expect(passwordFieldError('short', 'a@example.test')).toEqual({ path: 'password', message: PASSWORD_TOO_SHORT });
    expect(passwordFieldError('long enough password', 'a@example.test')).toBeNull();
  });

  it('adds the e-mail rule to a form schema once, on the password field', () => {
    const form = withPasswordPolicy(z.object({ email: z.string(), password: newPasswordSchema }));
    const same = form.safeParse({ email: 'someone.long@example.test', password: 'someone.long@example.test' });
    expect(same.success).toBe(false);
    expect(same.error?.issues.map((i) => [i.path.join('.'), i.message])).toEqual([['password', PASSWORD_IS_EMAIL]]);
    const short = form.safeParse({ email: 'x@example.test', password: 'short' });
    expect(short.error?.issues.map((i) => i.message)).toEqual([PASSWORD_TOO_SHORT]);
    expect(form.safeParse({ email: 'x@example.test', password: 'a fine long password' }).success).toBe(true);
  });
});
