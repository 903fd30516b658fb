import bcrypt from 'bcryptjs';

// bcrypt with cost 11: about 100 ms per hash on this machine class; slow enough for guessing, fast enough for sign-in.
const BCRYPT_COST = 11;

export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, BCRYPT_COST);
}

export function verifyPassword(password: string, hash: string): Promise<boolean> {
  return bcrypt.compare(password, hash);
}
