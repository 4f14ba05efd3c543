/** Error codes next-auth hands the sign-in form in `?error=`, and what the form says for each. */
export const SIGN_IN_THROTTLED = 'throttled';
export const SIGN_IN_BUSY = 'busy';
export const SIGN_IN_DEACTIVATED = 'deactivated';

export const THROTTLED_MESSAGE = 'Too many failed sign-ins for this e-mail. Wait 15 minutes, then try again.';
const BUSY_MESSAGE = 'NookPass is busy signing people in. Try again in a moment.';
// Wrong password and unknown e-mail read the same, so the answer does not tell whether an account exists.
// Said only after the right password, so it tells nothing to someone guessing.
const DEACTIVATED_MESSAGE = 'This account has been deactivated. Ask your company\'s owner or a NookPass administrator to reactivate it.';
const MISMATCH_MESSAGE = 'That e-mail and password do not match an account.';

export function signInErrorMessage(code: string | null | undefined): string {
  if (code === SIGN_IN_THROTTLED) return THROTTLED_MESSAGE;
  if (code === SIGN_IN_BUSY) return BUSY_MESSAGE;
  if (code === SIGN_IN_DEACTIVATED) return DEACTIVATED_MESSAGE;
  return MISMATCH_MESSAGE;
}
