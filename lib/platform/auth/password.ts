import bcrypt from 'bcryptjs';

// Cost 12 is about a quarter second here: slow for guessing, fine for one sign-in.
const COST = 12;
export const MIN_PASSWORD_LENGTH = 10;

export async function hashPassword(plain: string, cost = COST): Promise<string> {
  if (plain.length < MIN_PASSWORD_LENGTH) {
    throw new Error(`A password needs at least ${MIN_PASSWORD_LENGTH} characters.`);
  }
  return bcrypt.hash(plain, cost);
}

export function verifyPassword(plain: string, hash: string): Promise<boolean> {
  return bcrypt.compare(plain, hash);
}

// Compared against when the e-mail is unknown, so both failures take the same time.
export const DUMMY_HASH = bcrypt.hashSync('not-a-real-password-ever', COST);
